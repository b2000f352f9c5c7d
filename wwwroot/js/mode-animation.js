// Oscillates the atoms of a 3D Plotly chart along a normal mode, client-side (no server round trips).
// Trace 0 holds the atoms, trace 1 the bonds (pairs of points separated by nulls).
const running = new Map();

export function waitForPlot(id, timeoutMs) {
    return new Promise((resolve, reject) => {
        const started = performance.now();
        (function poll() {
            const el = document.getElementById(id);
            if (el && el.data && el.data.length >= 2 && window.Plotly) { resolve(el); return; }
            if (performance.now() - started > timeoutMs) { reject(new Error("plot " + id + " did not appear")); return; }
            setTimeout(poll, 100);
        })();
    });
}

export async function start(id, base, displacement, bonds, amplitude) {
    stop(id);
    const el = await waitForPlot(id, 15000);
    const state = { amplitude, playing: true, frame: 0, handle: 0, el };
    running.set(id, state);
    const n = base.length / 3;
    const periodMs = 1600;
    const t0 = performance.now();
    function tick(now) {
        if (!running.has(id) || running.get(id) !== state) return;
        if (state.playing) {
            const s = Math.sin(2 * Math.PI * ((now - t0) % periodMs) / periodMs) * state.amplitude;
            const ax = new Array(n), ay = new Array(n), az = new Array(n);
            for (let i = 0; i < n; i++) {
                ax[i] = base[3 * i] + s * displacement[3 * i];
                ay[i] = base[3 * i + 1] + s * displacement[3 * i + 1];
                az[i] = base[3 * i + 2] + s * displacement[3 * i + 2];
            }
            const bx = [], by = [], bz = [];
            for (let k = 0; k < bonds.length; k += 2) {
                const a = bonds[k], b = bonds[k + 1];
                bx.push(ax[a], ax[b], null); by.push(ay[a], ay[b], null); bz.push(az[a], az[b], null);
            }
            window.Plotly.restyle(el, { x: [ax, bx], y: [ay, by], z: [az, bz] }, [0, 1]);
            state.frame++;
            el.dataset.frames = String(state.frame);
        }
        state.handle = setTimeout(() => requestAnimationFrame(tick), 50);
    }
    requestAnimationFrame(tick);
}

export function setAmplitude(id, amplitude) {
    const s = running.get(id);
    if (s) s.amplitude = amplitude;
}

export function setPlaying(id, playing) {
    const s = running.get(id);
    if (s) s.playing = playing;
}

export function stop(id) {
    const s = running.get(id);
    if (s) { clearTimeout(s.handle); running.delete(id); }
}
