using System.Collections.Concurrent;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Demo;

/// <summary>
/// Entry point of the demo data: the showcase study (<see cref="Showcase"/>, what <c>seed-data/</c> holds) and a large varied
/// ledger for benchmarks and load tests (<see cref="Scale"/>). Pure functions: they return file names and contents and write
/// nothing; the command line writes them.
/// </summary>
public static class DemoData
{
    /// <summary>Reactions per study in the scale ledger.</summary>
    public const int ReactionsPerScaleStudy = 25;

    /// <summary>Largest reaction count <see cref="Scale"/> accepts.</summary>
    public const int MaxScaleReactions = 100_000;

    /// <summary>The showcase study as a bundle: <c>bundle.json</c>, the files it names, and a README.md that explains them.</summary>
    public static IReadOnlyList<DemoFile> Showcase()
    {
        var study = DemoScenario.Build();
        return [.. DemoWriter.Write(study), new DemoFile("README.md", DemoScenario.Readme(study))];
    }

    /// <summary>
    /// A large ledger of <paramref name="reactions"/> reactions for benchmarks and load tests: studies of
    /// <see cref="ReactionsPerScaleStudy"/> reactions, each a bundle in its own folder <c>study-0001/</c>. Reaction j follows
    /// the showcase reactions in turn, those whose species have one conformer each (so every verdict appears; the
    /// conformer ensembles of BU are not repeated), with its saddle point(s) displaced by up to 0.01 Å per
    /// coordinate (and so a Hessian of its own) and its invented energies (and those of its scan) shifted by up to ±4 kcal/mol.
    /// Minima are shared within a study. Deterministic for given arguments: a pseudo-random generator started from
    /// <paramref name="variant"/> and the study number drives every choice.
    /// </summary>
    public static IReadOnlyList<DemoFile> Scale(int reactions, int variant = 1)
    {
        if (reactions < 1 || reactions > MaxScaleReactions)
            throw new ArgumentException($"The reaction count must be between 1 and {MaxScaleReactions}, got {reactions}.", nameof(reactions));
        var showcase = DemoScenario.Build();
        var studyCount = (reactions + ReactionsPerScaleStudy - 1) / ReactionsPerScaleStudy;
        // Structure files of unchanged minima are identical in every study: make each once.
        var shared = new ConcurrentDictionary<string, string>(StringComparer.Ordinal);
        var perStudy = new IReadOnlyList<DemoFile>[studyCount];
        Parallel.For(0, studyCount, s =>
        {
            var first = s * ReactionsPerScaleStudy;
            var count = Math.Min(ReactionsPerScaleStudy, reactions - first);
            var study = ScaleStudy(showcase, s, first, count, variant);
            perStudy[s] = DemoWriter.Write(study, $"study-{s + 1:0000}/", sp =>
                sp.Label.StartsWith("TS-", StringComparison.Ordinal)
                    ? DemoWriter.QcSchema(sp, sp.GeometryLevel ?? study.GeometryLevel, sp.ForceField is null)
                    : shared.GetOrAdd(sp.Label, _ => DemoWriter.QcSchema(sp, sp.GeometryLevel ?? study.GeometryLevel, sp.ForceField is null)));
        });
        return [.. perStudy.SelectMany(f => f)];
    }

    private static DemoStudy ScaleStudy(DemoStudy showcase, int studyIndex, int firstReaction, int count, int variant)
    {
        var rng = new Random(unchecked(variant * 7919 + studyIndex * 104729 + 17));
        // Species with several conformers (several entries under one label) stay in the showcase only.
        var single = showcase.Species.GroupBy(s => s.Label).Where(g => g.Count() == 1).Select(g => g.Single()).ToList();
        var baseSpecies = single.ToDictionary(s => s.Label);
        var templates = showcase.Reactions.Where(r => r.States.SelectMany(s => s.Terms).All(t => baseSpecies.ContainsKey(t.Species))).ToList();
        var species = new List<DemoSpecies>();
        var used = new HashSet<string>(StringComparer.Ordinal);
        var reactions = new List<DemoReaction>();
        var scans = new List<DemoScan>();
        for (var k = 0; k < count; k++)
        {
            var number = firstReaction + k + 1;
            var template = templates[(number - 1) % templates.Count];
            var suffix = $"{number:00000}";
            var renamed = new Dictionary<string, string>(StringComparer.Ordinal);
            var states = new List<DemoState>();
            foreach (var st in template.States)
            {
                var terms = new List<(string, int)>();
                foreach (var (label, c) in st.Terms)
                {
                    if (!renamed.TryGetValue(label, out var newLabel))
                    {
                        var b = baseSpecies[label];
                        if (b.Kind == CalculationKind.SaddlePoint)
                        {
                            newLabel = $"{label}-{suffix}";
                            var geometry = Displace(b.Geometry, rng, 0.01);
                            var shift = Energy.FromKcalPerMol(4.0 * (2 * rng.NextDouble() - 1)).Hartree;
                            species.Add(b with
                            {
                                Label = newLabel,
                                Slug = $"{b.Slug}-{suffix}",
                                Geometry = geometry,
                                OptEnergyHartree = Math.Round(b.OptEnergyHartree + shift, 8),
                                SinglePointEnergyHartree = b.SinglePointEnergyHartree is { } e ? Math.Round(e + shift, 8) : null,
                            });
                            foreach (var sc in showcase.Scans.Where(x => x.Species == label))
                                scans.Add(sc with
                                {
                                    Label = $"{sc.Label} ({template.Label}-{suffix})",
                                    Slug = $"{sc.Slug}-{suffix}",
                                    Species = newLabel,
                                    Points = [.. sc.Points.Select(p => p with { EnergyHartree = Math.Round(p.EnergyHartree + shift, 8) })],
                                });
                        }
                        else
                        {
                            newLabel = label;
                            if (used.Add(label)) species.Add(b);
                        }
                        renamed[label] = newLabel;
                    }
                    terms.Add((newLabel, c));
                }
                states.Add(st with { Terms = terms });
            }
            reactions.Add(new DemoReaction($"{template.Label}-{suffix}", template.Description, states));
        }
        return new DemoStudy(
            $"Scale study {studyIndex + 1:0000} (invented data)",
            "Invented for benchmarks and load tests of BarrierLedger: variations of the demo study's reactions with displaced saddle " +
            "points and shifted invented energies. No calculation was run; no real person, group, paper or product is behind the data.",
            showcase.GeometryLevel, species, reactions, scans);
    }

    private static Molecule Displace(Molecule m, Random rng, double maxAngstrom)
    {
        var pos = m.PositionsAngstrom.Select(p => p + maxAngstrom * new Vec3(2 * rng.NextDouble() - 1, 2 * rng.NextDouble() - 1, 2 * rng.NextDouble() - 1));
        return GeometryBuilder.Rounded(new Molecule(m.Elements, pos, m.Charge, m.Multiplicity));
    }
}
