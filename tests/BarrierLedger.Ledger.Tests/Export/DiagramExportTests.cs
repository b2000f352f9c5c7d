using System.Xml.Linq;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Diagrams;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Reviews;
using SkiaSharp;

namespace BarrierLedger.Ledger.Tests.Export;

public class DiagramExportTests
{
    private static readonly DiagramSource s_source = new("R1 ring closure", ExportExamples.Model, "ΔG",
    [
        new("A", Energy.Zero, false),
        new("TS1", Energy.FromHartree(0.0392), true, ReviewState.Verified, Verdict.Passed),
        new("INT1", Energy.FromHartree(-0.0084), false),
        new("TS2", Energy.FromHartree(0.0106), true, ReviewState.Returned, Verdict.Failed, ["two significant imaginary modes"]),
        new("P", Energy.FromHartree(-0.0300), false),
    ], ["the pathway mixes two levels of theory"]);

    [Fact]
    public void Svg_IsWellFormed_AndMarksTheUnverifiedAndInconsistentSaddlePoints()
    {
        var files = DiagramExport.Build(s_source);
        var doc = XDocument.Parse(files.Svg);
        var texts = doc.Descendants(XName.Get("text", "http://www.w3.org/2000/svg")).Select(t => t.Value).ToList();
        Assert.Contains("TS1 [a]", texts);       // consistency mark only: TS1 is verified
        Assert.Contains("TS2 [b,a]", texts);     // returned by the reviewer, and the pathway is inconsistent
        var all = string.Join(" ", texts);
        Assert.Contains("[a] R1 ring closure: the energies break a consistency rule: the pathway mixes two levels of theory.", all);
        Assert.Contains("TS2: saddle point not verified by a reviewer (returned by the reviewer); automatic check: Failed (two significant imaginary modes).", all);
        Assert.Contains("wB97X-D/def2-TZVP (SMD, water)//B3LYP-D3/def2-SVP", all);
        Assert.Contains("298.15 K", all);
        Assert.Contains("1 mol/L", all);
        Assert.Contains("low-mode entropy interpolated", all);
        Assert.Contains("ΔG (kcal/mol)", all);
        Assert.Contains("thermal-hazard", all);
        // 0.0392 Eh × 627.509474 kcal/mol per Eh (CODATA 2018) = 24.598 → "24.6".
        Assert.Contains("24.6", texts);
    }

    [Fact]
    public void Png_HasTheSceneSize_AndDrawsLevelsInTheScreenColours()
    {
        var files = DiagramExport.Build(s_source, pngScale: 2f);
        Assert.Equal([0x89, 0x50, 0x4E, 0x47], files.Png.Take(4).Select(b => (int)b));
        using var bitmap = SKBitmap.Decode(files.Png);
        Assert.Equal((int)Math.Ceiling(files.Scene.Width * 2), bitmap.Width);
        Assert.Equal((int)Math.Ceiling(files.Scene.Height * 2), bitmap.Height);
        var levels = files.Scene.Lines.Where(l => l.Role == "level").ToList();
        Assert.Equal(5, levels.Count);
        foreach (var l in levels)
        {
            var px = bitmap.GetPixel((int)((l.X0 + l.X1) / 2 * 2), (int)(l.Y0 * 2));
            Assert.Equal(SKColor.Parse(l.Colour), px);
        }
        Assert.Equal(SKColor.Parse(DiagramStyle.SaddleColour), SKColor.Parse(levels[1].Colour));
    }

    [Fact]
    public void Png_DrawsText_WithTheEmbeddedFont()
    {
        var files = DiagramExport.Build(s_source, pngScale: 1f);
        using var bitmap = SKBitmap.Decode(files.Png);
        var title = files.Scene.Texts[0];
        var dark = 0;
        for (var x = (int)title.X - 80; x < (int)title.X + 80; x++)
            for (var y = (int)title.Y - 14; y < (int)title.Y + 2; y++)
                if (bitmap.GetPixel(x, y).Red < 128) dark++;
        Assert.True(dark > 100, $"only {dark} dark pixels where the title should be");
    }
}
