using BarrierLedger.Core.Diagrams;
using SkiaSharp;

namespace BarrierLedger.Ledger.Export;

/// <summary>
/// Renders the same <see cref="DiagramScene"/> as <see cref="SvgEnergyDiagram"/> to PNG with SkiaSharp (no browser, no
/// system fonts: DejaVu Sans is embedded, so the figure is the same on every machine).
/// </summary>
public static class PngEnergyDiagram
{
    private static readonly Lazy<SKTypeface> s_regular = new(() => LoadFont("DejaVuSans.ttf"));
    private static readonly Lazy<SKTypeface> s_bold = new(() => LoadFont("DejaVuSans-Bold.ttf"));

    /// <summary>PNG bytes of the scene at <paramref name="scale"/> pixels per SVG pixel (2 gives a sharp figure for print).</summary>
    public static byte[] Render(DiagramScene scene, float scale = 2f)
    {
        ArgumentNullException.ThrowIfNull(scene);
        if (!(scale > 0 && scale <= 8)) throw new ArgumentException("Scale must be in (0, 8].", nameof(scale));
        var width = (int)Math.Ceiling(scene.Width * scale);
        var height = (int)Math.Ceiling(scene.Height * scale);
        using var surface = SKSurface.Create(new SKImageInfo(width, height, SKColorType.Rgba8888, SKAlphaType.Premul))
            ?? throw new InvalidOperationException($"SkiaSharp could not create a {width}×{height} surface.");
        var canvas = surface.Canvas;
        canvas.Clear(SKColor.Parse(DiagramStyle.Background));
        canvas.Scale(scale);

        foreach (var l in scene.Lines)
        {
            using var paint = new SKPaint
            {
                Color = SKColor.Parse(l.Colour),
                StrokeWidth = (float)l.Width,
                IsAntialias = true,
                Style = SKPaintStyle.Stroke,
                StrokeCap = SKStrokeCap.Butt,
            };
            using var dash = l.Dashed ? SKPathEffect.CreateDash([6f, 4f], 0) : null;
            paint.PathEffect = dash;
            canvas.DrawLine((float)l.X0, (float)l.Y0, (float)l.X1, (float)l.Y1, paint);
        }
        foreach (var t in scene.Texts)
        {
            using var font = new SKFont(t.Bold ? s_bold.Value : s_regular.Value, (float)t.Size) { SkewX = t.Italic ? -0.2f : 0f, Subpixel = true };
            using var paint = new SKPaint { Color = SKColor.Parse(t.Colour), IsAntialias = true };
            var align = t.Anchor switch { TextAnchor.Middle => SKTextAlign.Center, TextAnchor.End => SKTextAlign.Right, _ => SKTextAlign.Left };
            canvas.Save();
            if (t.RotationDegrees != 0) canvas.RotateDegrees((float)t.RotationDegrees, (float)t.X, (float)t.Y);
            canvas.DrawText(t.Text, (float)t.X, (float)t.Y, align, font, paint);
            canvas.Restore();
        }
        using var image = surface.Snapshot();
        using var data = image.Encode(SKEncodedImageFormat.Png, 100)
            ?? throw new InvalidOperationException("SkiaSharp could not encode the diagram as PNG.");
        return data.ToArray();
    }

    private static SKTypeface LoadFont(string file)
    {
        var name = $"BarrierLedger.Ledger.Export.Fonts.{file}";
        using var stream = typeof(PngEnergyDiagram).Assembly.GetManifestResourceStream(name)
            ?? throw new InvalidOperationException($"Embedded font '{name}' is missing from the Ledger assembly.");
        using var ms = new MemoryStream();
        stream.CopyTo(ms);
        using var data = SKData.CreateCopy(ms.ToArray());
        return SKTypeface.FromData(data) ?? throw new InvalidOperationException($"SkiaSharp could not read the embedded font '{file}'.");
    }
}
