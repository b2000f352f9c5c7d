using System.Text;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Pathways;

namespace BarrierLedger.Demo.Tests;

public class DemoScaleTests
{
    private static List<Bundle> ReadAll(IReadOnlyList<DemoFile> files)
    {
        var byPath = files.ToDictionary(f => f.RelativePath, f => f.Content, StringComparer.Ordinal);
        var bundles = new List<Bundle>();
        foreach (var manifest in files.Where(f => f.RelativePath.EndsWith("/" + DemoWriter.ManifestName, StringComparison.Ordinal)))
        {
            var folder = manifest.RelativePath[..^DemoWriter.ManifestName.Length];
            var result = BundleReader.Read(new MemoryStream(Encoding.UTF8.GetBytes(manifest.Content)), manifest.RelativePath,
                openFile: p => byPath.TryGetValue(folder + p, out var text) ? new MemoryStream(Encoding.UTF8.GetBytes(text)) : null);
            Assert.True(result.Succeeded && result.Issues.IsEmpty, manifest.RelativePath + ":\n" + string.Join("\n", result.Issues));
            bundles.Add(result.Value!);
        }
        return bundles;
    }

    [Fact]
    public void Small_ledger_reads_cleanly_with_the_asked_number_of_reactions_in_studies_of_25()
    {
        var files = DemoData.Scale(31);
        var bundles = ReadAll(files);
        Assert.Equal(2, bundles.Count);
        Assert.Equal([25, 6], bundles.Select(b => b.Reactions.Length));
        Assert.Equal(31, bundles.SelectMany(b => b.Reactions).Select(r => r.Label).Distinct().Count());
        Assert.All(bundles, b => Assert.Contains("Invented", b.Study.Description, StringComparison.Ordinal));
    }

    [Fact]
    public void Same_arguments_give_the_same_files_and_another_variant_other_ones()
    {
        var a = DemoData.Scale(7);
        var b = DemoData.Scale(7);
        Assert.Equal(a, b);
        var c = DemoData.Scale(7, variant: 2);
        Assert.NotEqual(a.Single(f => f.RelativePath.EndsWith("ts-da-00001.json", StringComparison.Ordinal)).Content,
                        c.Single(f => f.RelativePath.EndsWith("ts-da-00001.json", StringComparison.Ordinal)).Content);
    }

    [Fact]
    public void Copies_of_a_reaction_have_their_own_saddle_geometry_and_the_ledger_keeps_every_verdict()
    {
        var bundle = ReadAll(DemoData.Scale(15)).Single();
        var da = bundle.Calculations.Where(c => c.Kind == CalculationKind.SaddlePoint && c.Species.StartsWith("TS-DA-", StringComparison.Ordinal)).ToList();
        Assert.Equal(3, da.Count); // reactions 1, 8, 15 (seven template reactions)
        Assert.False(da[0].Geometry!.SameAs(da[1].Geometry!, 1e-4));

        var verdicts = new HashSet<Verdict>();
        foreach (var state in bundle.Reactions.SelectMany(r => r.States).Where(s => s.Kind == StateKind.SaddlePoint))
        {
            var calc = bundle.Calculations.Single(c => c.Label == state.Calculation);
            verdicts.Add(SaddleCheck.Run(SaddleCheckInput.FromHessian(calc.Geometry!, [.. calc.HessianHartreePerBohr2],
                [.. state.ReactionCoordinate.Select(p => (p.First - 1, p.Second - 1))])).Verdict);
        }
        Assert.Equal([Verdict.Passed, Verdict.NeedsAttention, Verdict.Failed], verdicts.Order());
    }

    [Fact]
    public void Reaction_count_outside_the_range_is_refused()
    {
        Assert.Throws<ArgumentException>(() => DemoData.Scale(0));
        Assert.Throws<ArgumentException>(() => DemoData.Scale(DemoData.MaxScaleReactions + 1));
    }
}
