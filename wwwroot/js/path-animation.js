// Steps the atoms of a 3D Plotly chart through the frames of a path (an IRC), client-side, with the bonds of each frame.
// Trace 0 holds the atoms, trace 1 the bonds; frames are flat [x1, y1, z1, x2, ...] arrays, bonds flat [a1, b1, a2, b2, ...].
import { waitForPlot } from "./mode-animation.js";

const paths = new Map();

function draw(state, k) {
    const f = state.frames[k], bonds = state.bonds[k];
    const n = f.length / 3;
    const ax = new Array(n), ay = new Array(n), az = new Array(n);
    for (let i = 0; i < n; i++) { ax[i] = f[3 * i]; ay[i] = f[3 * i + 1]; az[i] = f[3 * i + 2]; }
    const bx = [], by = [], bz = [];
    for (let j = 0; j < bonds.length; j += 2) {
        const a = bonds[j], b = bonds[j + 1];
        bx.push(ax[a], ax[b], null); by.push(ay[a], ay[b], null); bz.push(az[a], az[b], null);
    }
    window.Plotly.restyle(state.el, { x: [ax, bx], y: [ay, by], z: [az, bz] }, [0, 1]);
    state.frame = k;
    state.el.dataset.frame = String(k);
}

export async function load(id, frames, bonds, start) {
    stop(id);
    const el = await waitForPlot(id, 15000);
    const state = { el, frames, bonds, frame: start, step: 1, handle: 0 };
    paths.set(id, state);
    draw(state, start);
}

// Back and forth from end to end, one frame every 90 ms.
export function play(id, playing) {
    const s = paths.get(id);
    if (!s) return;
    clearInterval(s.handle);
    s.handle = 0;
    if (!playing) return;
    s.handle = setInterval(() => {
        if (s.frame + s.step < 0 || s.frame + s.step >= s.frames.length) s.step = -s.step;
        draw(s, s.frame + s.step);
    }, 90);
}

export function show(id, k) {
    const s = paths.get(id);
    if (s && k >= 0 && k < s.frames.length) draw(s, k);
}

export function stop(id) {
    const s = paths.get(id);
    if (s) { clearInterval(s.handle); paths.delete(id); }
}
