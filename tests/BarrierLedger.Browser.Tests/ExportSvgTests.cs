using System.Text;
using BarrierLedger.Browser.Tests.Infrastructure;
using BarrierLedger.Core.Diagrams;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Browser.Tests;

/// <summary>The exported SVG diagram renders in a real chromium: same pixels where the levels are, and a screenshot is taken.</summary>
public sealed class ExportSvgTests
{
    [SkippableFact]
    public async Task ExportedSvg_RendersInChromium_WithTheLevelColours()
    {
        Chromium.SkipIfMissing();
        DiagramState[] states = [new("A", Energy.Zero, false), new("TS1", Energy.FromKcalPerMol(21.3), true), new("P", Energy.FromKcalPerMol(-7.9), false)];
        var layout = EnergyDiagram.Layout(states, "ΔG", EnergyUnit.KcalPerMol);
        var text = new DiagramText("R1", ["Level of theory: A/b//C/d"], new Dictionary<int, string> { [1] = "a" }, ["[a] TS1 is not verified."], "Caution: model estimates.");
        var scene = SvgEnergyDiagram.Scene(layout, text);
        var svg = SvgEnergyDiagram.ToSvg(scene, text.Title);

        var (playwright, browser) = await Chromium.LaunchAsync();
        try
        {
            var page = await browser.NewPageAsync(new() { ViewportSize = new() { Width = (int)scene.Width + 20, Height = (int)scene.Height + 20 } });
            var data = "data:image/svg+xml;base64," + Convert.ToBase64String(Encoding.UTF8.GetBytes(svg));
            await page.SetContentAsync($"<html><body style='margin:0'><img id='d' src='{data}'></body></html>");
            await page.WaitForFunctionAsync("() => document.getElementById('d').complete && document.getElementById('d').naturalWidth > 0");
            Assert.Equal((int)scene.Width, await page.EvaluateAsync<int>("() => document.getElementById('d').naturalWidth"));

            var saddle = scene.Lines.Single(l => l.Role == "level" && l.Colour == DiagramStyle.SaddleColour);
            var rgb = await page.EvaluateAsync<int[]>(@"([x, y]) => {
                const img = document.getElementById('d');
                const c = document.createElement('canvas'); c.width = img.naturalWidth; c.height = img.naturalHeight;
                const g = c.getContext('2d'); g.drawImage(img, 0, 0);
                return Array.from(g.getImageData(x, y, 1, 1).data.slice(0, 3)); }",
                new[] { (int)((saddle.X0 + saddle.X1) / 2), (int)saddle.Y0 });
            Assert.Equal(new[] { 0xb5, 0x47, 0x0b }, rgb);

            var shot = await page.Locator("#d").ScreenshotAsync();
            Assert.True(shot.Length > 5000, $"screenshot of {shot.Length} bytes");
            File.WriteAllBytes(Path.Combine(Path.GetTempPath(), "barrierledger-export-svg-in-chromium.png"), shot);
        }
        finally
        {
            await browser.CloseAsync();
            playwright.Dispose();
        }
    }
}
