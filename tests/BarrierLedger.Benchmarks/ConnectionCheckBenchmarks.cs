using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Paths;
using BenchmarkDotNet.Attributes;

namespace BarrierLedger.Benchmarks;

/// <summary>
/// The connection check of a 2,000-frame IRC of a 100-atom system against 4 states (issue 20: ≤ 200 ms). The system: two
/// hexadecyl radicals (C16H33, 49 atoms each) joining into dotriacontane, plus a spectating H2 molecule (100 atoms); the path
/// closes the C16···C17 gap from 4.5 Å to 1.54 Å over 2,000 frames, saddle frame at 2.2 Å. States: 2 C16H33 + H2 (before),
/// C32H66 + H2 (after), another C32H66 + H2 entry and 2 C16H34 (others). Every species is stored in a shuffled atom order, so each
/// matching end goes through the graph-isomorphism mapping.
/// "Check" is <see cref="ConnectionCheck.Run"/> on a built path (bond graph of every frame, end matching); "Build path and check"
/// adds <see cref="IrcPath.FromFrames"/> (a Kabsch superposition per frame pair and one per frame against the saddle point).
/// Run: dotnet run -c Release --project tests/BarrierLedger.Benchmarks -- --filter '*ConnectionCheck*'
/// </summary>
[SimpleJob(launchCount: 1, warmupCount: 2, iterationCount: 8)]
[MemoryDiagnoser, MinColumn, MedianColumn]
public class ConnectionCheckBenchmarks
{
    private List<Molecule> _frames = [];
    private List<double> _energies = [];
    private Molecule _saddle = null!;
    private ReactionPath _path = null!;
    private ConnectionCheckInput _input = null!;

    [GlobalSetup]
    public void Setup()
    {
        const int count = 2000;
        var rng = new Random(20);
        for (var k = 0; k < count; k++)
        {
            var gap = 4.5 - (4.5 - 1.54) * k / (count - 1);
            _frames.Add(Joining(gap));
            _energies.Add(-1256.0 + 0.02 * Math.Exp(-Math.Pow((gap - 2.2) / 0.4, 2)) - 0.05 * (4.5 - gap) / 3);
        }
        var saddleIndex = Enumerable.Range(0, count).MinBy(k => Math.Abs(4.5 - (4.5 - 1.54) * k / (count - 1) - 2.2));
        _saddle = _frames[saddleIndex];
        _path = IrcPath.FromFrames(_frames, _energies, _saddle);

        var apart = _frames[0];
        var joined = Joining(1.54);
        var g = Connectivity.Of(apart);
        var pieces = g.Components().Select(c => apart.Fragment(c)).ToList(); // hexadecyl, hexadecyl, H2
        var chain = Connectivity.Of(joined).Components().Select(c => joined.Fragment(c)).OrderByDescending(m => m.AtomCount).First();
        var hexadecane = Hexadecane(pieces[0]);
        StateSpecies S(string label, Molecule m, int n = 1) => new(label, Shuffled(m, rng), n);
        var h2 = S("dihydrogen", pieces.Single(p => p.AtomCount == 2));
        _input = new ConnectionCheckInput(_saddle,
            new StateStructure("2 hexadecyl + H2", [S("hexadecyl", pieces.First(p => p.AtomCount == 49), 2), h2]),
            new StateStructure("dotriacontane + H2", [S("dotriacontane", chain), h2]),
            [new StateStructure("dotriacontane (other entry) + H2", [S("dotriacontane B", chain), h2]), new StateStructure("2 hexadecane", [S("hexadecane", hexadecane, 2)])],
            _path);
        var result = ConnectionCheck.Run(_input);
        Console.WriteLine($"// {_frames[0].AtomCount} atoms, {count} frames; verdict {result.Connection}: {result.Headline}");
        if (result.Connection != Connection.BothSides) throw new InvalidOperationException("The benchmark system must connect both sides:\n" + result.Report());
    }

    [Benchmark(Baseline = true, Description = "Check (path built)")]
    public ConnectionCheckResult Check() => ConnectionCheck.Run(_input);

    [Benchmark(Description = "Build path and check")]
    public ConnectionCheckResult BuildAndCheck() => ConnectionCheck.Run(_input with { Path = IrcPath.FromFrames(_frames, _energies, _saddle) });

    /// <summary>Two zigzag C16H33 chains on one line, the radical ends <paramref name="gap"/> Å apart, and H2 10 Å off to the side.</summary>
    private static Molecule Joining(double gap)
    {
        var elements = new List<Element>();
        var positions = new List<Vec3>();
        const double cc = 1.54, half = 56.0 * Math.PI / 180; // C–C–C 112°
        var step = new Vec3(cc * Math.Sin(half), cc * Math.Cos(half), 0);
        var carbons = new List<Vec3>();
        for (var k = 0; k < 32; k++)
        {
            if (k == 0) { carbons.Add(Vec3.Zero); continue; }
            var s = k % 2 == 1 ? step : new Vec3(step.X, -step.Y, 0);
            var length = k == 16 ? gap / cc : 1.0;
            carbons.Add(carbons[^1] + s * length);
        }
        for (var k = 0; k < 32; k++)
        {
            elements.Add(Elements.C);
            positions.Add(carbons[k]);
            var neighbours = new List<Vec3>();
            // The radical carbons C16 and C17 carry their two hydrogens as if already bonded to each other (directions only).
            if (k > 0) neighbours.Add((carbons[k - 1] - carbons[k]).Normalized());
            if (k < 31) neighbours.Add((carbons[k + 1] - carbons[k]).Normalized());
            var z = new Vec3(0, 0, 1);
            if (neighbours.Count == 2)
            {
                var b = (neighbours[0] + neighbours[1]).Normalized();
                foreach (var sign in new[] { 1.0, -1.0 }) AddH(carbons[k] + 1.09 * (-0.577 * b + sign * 0.816 * z));
            }
            else
            {
                var u = neighbours[0];
                var e1 = u.Cross(z).Normalized();
                var e2 = u.Cross(e1).Normalized();
                for (var j = 0; j < 3; j++)
                {
                    var phi = 2 * Math.PI * j / 3;
                    AddH(carbons[k] + 1.09 * (-u / 3 + 0.943 * (Math.Cos(phi) * e1 + Math.Sin(phi) * e2)));
                }
            }
        }
        AddH(new Vec3(20, 10, 0));
        AddH(new Vec3(20.74, 10, 0));
        return new Molecule(elements, positions);

        void AddH(Vec3 p)
        {
            elements.Add(Elements.H);
            positions.Add(p);
        }
    }

    /// <summary>A hexadecyl radical with a hydrogen added at its radical carbon: hexadecane.</summary>
    private static Molecule Hexadecane(Molecule hexadecyl)
    {
        var g = Connectivity.Of(hexadecyl);
        var radical = Enumerable.Range(0, hexadecyl.AtomCount).Single(i => hexadecyl.Elements[i].Symbol == "C" && g.Neighbours(i).Length == 3
            && g.Neighbours(i).Count(n => hexadecyl.Elements[n].Symbol == "H") == 2 && g.Neighbours(i).Count(n => hexadecyl.Elements[n].Symbol == "C") == 1);
        var c = g.Neighbours(radical).Single(n => hexadecyl.Elements[n].Symbol == "C");
        var away = (hexadecyl.PositionsAngstrom[radical] - hexadecyl.PositionsAngstrom[c]).Normalized();
        return new Molecule([.. hexadecyl.Elements, Elements.H], [.. hexadecyl.PositionsAngstrom, hexadecyl.PositionsAngstrom[radical] + 1.09 * away]);
    }

    private static Molecule Shuffled(Molecule m, Random rng)
    {
        var order = Enumerable.Range(0, m.AtomCount).OrderBy(_ => rng.Next()).ToArray();
        return new Molecule(order.Select(i => m.Elements[i]), order.Select(i => m.PositionsAngstrom[i] + new Vec3(3, -2, 1)));
    }
}
