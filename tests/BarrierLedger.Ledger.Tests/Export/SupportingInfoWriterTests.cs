using System.IO.Compression;
using BarrierLedger.Core.Formats;
using BarrierLedger.Ledger.Export;

namespace BarrierLedger.Ledger.Tests.Export;

public class SupportingInfoWriterTests
{
    private static readonly SiStructure[] s_structures =
    [
        new("H2O", "minimum", "wB97X-D/def2-TZVP//B3LYP-D3/def2-SVP", -76.4321, 0.021234, 0.025012, 0.003612, [], ExportExamples.Water),
        new("TS 1/a", "saddle point", "wB97X-D/def2-TZVP//B3LYP-D3/def2-SVP", -76.3000, null, null, null, [-512.44, -31.2], ExportExamples.Water),
        new("TS 1/a", "saddle point", "other", -76.2000, null, null, null, [-400.0], ExportExamples.Water),
    ];

    [Fact]
    public void Text_HasEveryStructure_WithEnergies_ImaginaryModes_AndXyz()
    {
        var text = SupportingInfoWriter.WriteText("Study X", ExportExamples.Model, s_structures);
        Assert.Contains("298.15 K", text);
        Assert.Contains("Electronic energy (Eh): -76.43210000", text);
        Assert.Contains("Zero-point energy (Eh): 0.021234", text);
        Assert.Contains("Gibbs-energy correction (Eh): 0.003612", text);
        Assert.Contains("Zero-point energy (Eh): not available", text);
        Assert.Contains("Imaginary frequencies: 0\n", text);
        Assert.Contains("Imaginary frequencies: 2 (512.4i, 31.2i)", text);
        Assert.Contains("Role: saddle point", text);
        Assert.Contains("O      0.00000000     0.00000000     0.11730000", text);
        // Each XYZ block reads back with the project's XYZ reader.
        var block = text.Split("Imaginary frequencies: 0\n")[1].Split("\n=")[0];
        var doc = XyzReader.ReadText(block, "block.xyz").GetValueOrThrow();
        Assert.True(doc.Last.Molecule.SameAs(ExportExamples.Water, 1e-8));
    }

    [Fact]
    public void Zip_HoldsOneXyzPerStructure_ThatReadsBack()
    {
        using var zip = new ZipArchive(new MemoryStream(SupportingInfoWriter.WriteXyzZip(s_structures)));
        Assert.Equal(["H2O.xyz", "TS_1_a.xyz", "TS_1_a-2.xyz"], zip.Entries.Select(e => e.FullName));
        using var reader = new StreamReader(zip.Entries[1].Open());
        var doc = XyzReader.ReadText(reader.ReadToEnd(), "TS_1_a.xyz").GetValueOrThrow();
        Assert.True(doc.Last.Molecule.SameAs(ExportExamples.Water, 0));
        Assert.Equal(-76.3000, doc.Last.EnergyHartree);
        Assert.Equal("saddle point", doc.Last.Keys["role"]);
    }

    [Theory]
    [InlineData("TS1", "TS1")]
    [InlineData("../../etc/passwd", "_.._etc_passwd")]
    [InlineData("A + B", "A___B")]
    [InlineData("...", "structure")]
    public void SafeFileName_KeepsNamesInsideTheZip(string label, string expected) => Assert.Equal(expected, SupportingInfoWriter.SafeFileName(label));
}
