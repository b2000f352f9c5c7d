using System.IO.Compression;
using System.Security.Cryptography;
using System.Text.Json;
using BarrierLedger.Core.Formats;

namespace BarrierLedger.Core.Tests.Formats;

/// <summary>The bundle writer against the reader and the published schema: what is written reads back to the same records.</summary>
public sealed class BundleWriterTests
{
    private static Bundle Read(byte[] zip) => BundleReader.Read(new MemoryStream(zip), "b.zip").GetValueOrThrow();

    [Fact]
    public void ToZip_OfTheSampleBundle_ReadsBackToTheSameRecordsAndFiles()
    {
        var original = Read(BundleReaderTests.SampleZip());

        var zip = BundleWriter.ToZip(original);
        var result = BundleReader.Read(new MemoryStream(zip), "again.zip");

        Assert.True(result.Succeeded, string.Join("\n", result.Issues));
        Assert.Empty(result.Warnings);
        var again = result.GetValueOrThrow();
        Assert.Equal(original.Study, again.Study);
        Assert.Equal(original.Species.ToArray(), again.Species.ToArray());
        Assert.Equal(original.Calculations.Length, again.Calculations.Length);
        foreach (var (a, b) in original.Calculations.Zip(again.Calculations))
        {
            Assert.Equal((a.Label, a.Species, a.Kind, a.LevelOfTheory, a.EnergyHartree, a.File, a.Note), (b.Label, b.Species, b.Kind, b.LevelOfTheory, b.EnergyHartree, b.File, b.Note));
            Assert.Equal(a.Geometry?.PositionsAngstrom.ToArray(), b.Geometry?.PositionsAngstrom.ToArray());
            Assert.Equal(a.Geometry?.Elements.ToArray(), b.Geometry?.Elements.ToArray());
            Assert.Equal(a.FrequenciesCm1.ToArray(), b.FrequenciesCm1.ToArray());
            Assert.Equal(a.Modes.Select(m => (m.FrequencyCm1, m.ReducedMassDalton)), b.Modes.Select(m => (m.FrequencyCm1, m.ReducedMassDalton)));
            Assert.Equal(a.Modes.SelectMany(m => m.DisplacementCartesian), b.Modes.SelectMany(m => m.DisplacementCartesian));
            Assert.Equal(a.HessianHartreePerBohr2.ToArray(), b.HessianHartreePerBohr2.ToArray());
            Assert.Equal(a.ThermalCorrections, b.ThermalCorrections);
        }
        Assert.Equal(original.Reactions.Select(r => (r.Label, r.Description)), again.Reactions.Select(r => (r.Label, r.Description)));
        Assert.Equal(original.Reactions.SelectMany(r => r.States).Select(s => (s.Label, s.Kind, s.Calculation, string.Join(";", s.Terms), string.Join(";", s.ReactionCoordinate))),
            again.Reactions.SelectMany(r => r.States).Select(s => (s.Label, s.Kind, s.Calculation, string.Join(";", s.Terms), string.Join(";", s.ReactionCoordinate))));
        Assert.Equal(original.Scans.Select(s => (s.Label, s.Species, s.LevelOfTheory, s.Coordinate.Kind, string.Join(",", s.Coordinate.Atoms), s.PointsFile, s.GeometriesFile)),
            again.Scans.Select(s => (s.Label, s.Species, s.LevelOfTheory, s.Coordinate.Kind, string.Join(",", s.Coordinate.Atoms), s.PointsFile, s.GeometriesFile)));
        Assert.Equal(original.Scans.SelectMany(s => s.Points).Select(p => (p.Coordinate, p.EnergyHartree, p.Converged)),
            again.Scans.SelectMany(s => s.Points).Select(p => (p.Coordinate, p.EnergyHartree, p.Converged)));
        Assert.NotEmpty(original.Ircs);
        Assert.Equal(original.Ircs.Select(i => (i.Label, i.SaddlePoint, i.LevelOfTheory, i.PathFile, i.ForwardFile, i.BackwardFile)),
            again.Ircs.Select(i => (i.Label, i.SaddlePoint, i.LevelOfTheory, i.PathFile, i.ForwardFile, i.BackwardFile)));
        Assert.Equal(Shas(original), Shas(again));
    }

    [Fact]
    public void ToManifest_PassesThePublishedSchema_AndWritingItAgainGivesTheSameBytes()
    {
        var original = Read(BundleReaderTests.SampleZip());
        var manifest = BundleWriter.ToManifest(original);

        using var schema = JsonDocument.Parse(File.ReadAllText(RepoFiles.Path("docs", "bundle.schema.json")));
        using var doc = JsonDocument.Parse(manifest);
        var errors = new MiniJsonSchema(schema.RootElement).Validate(doc.RootElement);
        Assert.True(errors.Count == 0, string.Join("\n", errors));
        Assert.Equal(manifest, BundleWriter.ToManifest(Read(BundleWriter.ToZip(original))));
    }

    [Fact]
    public void ToZip_AnUnsafeFilePath_IsRefusedWithThePath()
    {
        var b = Read(BundleReaderTests.SampleZip());
        var bad = b with { Files = b.Files.Add("../outside.xyz", [1, 2, 3]) };

        var e = Assert.Throws<ArgumentException>(() => BundleWriter.ToZip(bad));
        Assert.Contains("'../outside.xyz'", e.Message);
    }

    [Fact]
    public void ToZip_HoldsTheManifestAtItsRoot_AndEveryFileByteForByte()
    {
        var b = Read(BundleReaderTests.SampleZip());
        using var zip = new ZipArchive(new MemoryStream(BundleWriter.ToZip(b)));

        Assert.Equal([BundleSchema.ManifestEntryName, .. b.Files.Keys.Order(StringComparer.Ordinal)], zip.Entries.Select(e => e.FullName));
        foreach (var (path, bytes) in b.Files)
        {
            using var s = zip.GetEntry(path)!.Open();
            using var copy = new MemoryStream();
            s.CopyTo(copy);
            Assert.Equal(bytes.ToArray(), copy.ToArray());
        }
    }

    private static List<(string, string)> Shas(Bundle b) =>
        [.. b.Files.OrderBy(f => f.Key, StringComparer.Ordinal).Select(f => (f.Key, Convert.ToHexStringLower(SHA256.HashData(f.Value.AsSpan()))))];
}
