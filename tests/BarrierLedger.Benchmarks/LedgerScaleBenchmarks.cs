using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Uploads;
using BenchmarkDotNet.Attributes;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Benchmarks;

/// <summary>
/// A study of 2,000 reactions over 10,000 species (each reaction A + B → TS → C + D with its own five species, every species
/// with a geometry and frequencies, invented). Goals of issue 6: recompute every derived value after an energy-model change
/// ≤ 2 s; the ledger query for the study ≤ 50 ms.
/// </summary>
[Config(typeof(LedgerBenchConfig))]
public class LedgerScaleBenchmarks
{
    private const int Reactions = 2000;
    private LedgerBenchHost _host = null!;
    private int _studyId;
    private bool _warm;

    /// <summary>The same study on each engine, in one run (PostgreSQL: a throwaway local cluster, fsync off).</summary>
    [Params(StoreProvider.Sqlite, StoreProvider.PostgreSQL)]
    public StoreProvider Store { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        _host = new LedgerBenchHost(Store);
        var outcome = _host.Get<UploadService>().StoreDraftAsync(BuildDraft(), new UploadChoices { UploadKey = "scale" }, "bench").GetAwaiter().GetResult();
        if (!outcome.Stored) throw new InvalidOperationException(string.Join("\n", outcome.Errors.Take(20)));
        _studyId = outcome.StudyId!.Value;
        using var db = _host.Services.GetService(typeof(IDbContextFactory<LedgerDbContext>)) is IDbContextFactory<LedgerDbContext> f ? f.CreateDbContext() : throw new InvalidOperationException();
        var species = db.Species.Count();
        var reactions = db.ReactionDerivations.Count();
        Console.WriteLine($"// stored {species} species, {reactions} derived reactions");
        LedgerBenchHost.PrintLoadAverage("before the runs");
        if (species != 5 * Reactions || reactions != Reactions) throw new InvalidOperationException("the set-up did not give 10,000 species in 2,000 derived reactions");
    }

    [GlobalCleanup]
    public void Cleanup()
    {
        LedgerBenchHost.PrintLoadAverage("after the runs");
        _host.Dispose();
    }

    /// <summary>Flip the study's temperature (298.15 K ↔ 310 K) so every derived value is stale, then recompute all of them.</summary>
    [Benchmark(Description = "recompute 2,000 reactions / 10,000 species after an energy-model change")]
    public RecomputeProgress Recompute()
    {
        using (var db = _host.Get<IDbContextFactory<LedgerDbContext>>().CreateDbContext())
        {
            var row = db.EnergyModels.FirstOrDefault(m => m.StudyId == _studyId);
            if (row is null) db.EnergyModels.Add(row = new EnergyModel { StudyId = _studyId });
            _warm = !_warm;
            row.TemperatureKelvin = _warm ? 310 : 298.15;
            db.SaveChanges();
        }
        var p = _host.Get<RecomputeService>().RecomputeAsync([_studyId]).GetAwaiter().GetResult();
        if (p.Done != Reactions) throw new InvalidOperationException($"recomputed {p.Done} reactions");
        return p;
    }

    /// <summary>
    /// As <see cref="Recompute"/>, but every species forgets which geometry its point group came from first, so the pass detects
    /// the point group and σ of all 10,000 species again (the cost of σ detection; <see cref="Recompute"/> detects none, as
    /// after any model change that keeps the thermal level). Issue 16 goal: ≤ <see cref="Recompute"/> + 20 %.
    /// </summary>
    [Benchmark(Description = "recompute 2,000 reactions / 10,000 species, every point group and σ detected again")]
    public RecomputeProgress RecomputeDetectingSymmetry()
    {
        using (var db = _host.Get<IDbContextFactory<LedgerDbContext>>().CreateDbContext())
            db.Species.Where(s => s.StudyId == _studyId).ExecuteUpdate(u => u.SetProperty(s => s.SymmetryCalculationId, (int?)null));
        return Recompute();
    }

    [Benchmark(Description = "ledger query, 2,000 reactions with barriers, verdicts and review status")]
    public int LedgerQuery()
    {
        var page = _host.Get<LedgerQueryService>().GetLedgerRowsAsync(_studyId).GetAwaiter().GetResult();
        if (page.Rows.Count != Reactions) throw new InvalidOperationException($"{page.Rows.Count} rows");
        return page.Rows.Count;
    }

    private static UploadDraft BuildDraft()
    {
        var d = new UploadDraft { StudyName = "Scale study (invented)", PrimaryFile = "scale.json" };
        d.Files["scale.json"] = "{\"invented\": \"scale benchmark\"}"u8.ToArray();
        var level = LevelOfTheory.Parse("MODEL-A/basis-1");
        var random = new Random(6);
        // A + B → TS → C + D with A = D = C2H6, B = C = C2H4, TS = C4H10: atoms are conserved at every state.
        (string Suffix, string Formula, CalculationKind Kind, double Energy)[] parts =
        [
            ("a", "C2H6", CalculationKind.Minimum, -79.80), ("b", "C2H4", CalculationKind.Minimum, -78.55),
            ("ts", "C4H10", CalculationKind.SaddlePoint, -158.32), ("c", "C2H4", CalculationKind.Minimum, -78.55), ("d", "C2H6", CalculationKind.Minimum, -79.81),
        ];
        for (var r = 0; r < Reactions; r++)
        {
            foreach (var (suffix, formula, kind, energy) in parts)
            {
                var label = $"r{r}-{suffix}";
                var mol = Chain(formula);
                var n = 3 * mol.AtomCount - 6;
                var freqs = Enumerable.Range(0, n).Select(i => 120.0 + 2900.0 * i / n + random.NextDouble() * 10).ToArray();
                if (kind == CalculationKind.SaddlePoint) freqs[0] = -800 - random.NextDouble() * 400;
                d.Species.Add(new DraftSpecies(label, 0, 1));
                d.Calculations.Add(new DraftCalculation(label, label, kind, level, energy + random.NextDouble() * 0.01, mol, freqs, [], [],
                    null, null, null, null, null, ""));
            }
            d.Reactions.Add(new DraftReaction($"R{r:D4}", "invented", [
                new DraftState("A + B", Core.Pathways.StateKind.Minimum, [new DraftTerm($"r{r}-a", 1), new DraftTerm($"r{r}-b", 1)], null, []),
                new DraftState("TS", Core.Pathways.StateKind.SaddlePoint, [new DraftTerm($"r{r}-ts", 1)], $"r{r}-ts", [(1, 3)]),
                new DraftState("C + D", Core.Pathways.StateKind.Minimum, [new DraftTerm($"r{r}-c", 1), new DraftTerm($"r{r}-d", 1)], null, []),
            ]));
        }
        return d;
    }

    /// <summary>A zig-zag carbon chain with hydrogens around it: an invented but non-degenerate geometry for the formula.</summary>
    private static Molecule Chain(string formula)
    {
        var f = Formula.Parse(formula);
        var elements = new List<Element>();
        var positions = new List<Vec3>();
        for (var c = 0; c < f["C"]; c++) { elements.Add(Elements.C); positions.Add(new Vec3(1.25 * c, c % 2 == 0 ? 0 : 0.8, 0)); }
        for (var h = 0; h < f["H"]; h++)
        {
            var c = h % f["C"];
            var angle = 2 * Math.PI * (h / f["C"]) / 3.0;
            positions.Add(positions[c] + new Vec3(0.3, 0.9 * Math.Cos(angle), 0.9 * Math.Sin(angle)));
            elements.Add(Elements.H);
        }
        return new Molecule(elements, positions);
    }
}
