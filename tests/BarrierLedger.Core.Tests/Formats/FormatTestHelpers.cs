using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Tests.Formats;

internal static class FormatTestHelpers
{
    public static MemoryStream Utf8(string text) => new(Encoding.UTF8.GetBytes(text));

    /// <summary>Water at a bent geometry (O–H 0.9572 Å, H–O–H 104.52°; experimental r_e, θ_e, from memory).</summary>
    public static Molecule Water()
    {
        var r = 0.9572;
        var half = 104.52 / 2 * Math.PI / 180;
        return new Molecule(
            [Elements.O, Elements.H, Elements.H],
            [new Vec3(0, 0, 0), new Vec3(r * Math.Sin(half), 0, r * Math.Cos(half)), new Vec3(-r * Math.Sin(half), 0, r * Math.Cos(half))]);
    }

    /// <summary>Asserts exactly one error, on <paramref name="line"/> (or JSON path), whose message contains every fragment.</summary>
    public static void SingleError<T>(ReadResult<T> result, int? line, string? jsonPath, params string[] fragments) where T : class
    {
        Assert.False(result.Succeeded, "expected the read to fail");
        var errors = result.Errors.ToList();
        Assert.True(errors.Count == 1, "expected one error, got:\n" + string.Join("\n", errors));
        var e = errors[0];
        Assert.Equal(line, e.Line);
        Assert.Equal(jsonPath, e.JsonPath);
        foreach (var f in fragments) Assert.Contains(f, e.Message);
    }
}
