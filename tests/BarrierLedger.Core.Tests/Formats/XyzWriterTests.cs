using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using static BarrierLedger.Core.Tests.Formats.FormatTestHelpers;

namespace BarrierLedger.Core.Tests.Formats;

public class XyzWriterTests
{
    [Fact]
    public void Plain_xyz_round_trip_is_exact()
    {
        var water = Water();
        var text = XyzWriter.ToText(water, -76.4266738291);
        var back = XyzReader.Read(Utf8(text), "w.xyz").GetValueOrThrow().Frames.Single();
        Assert.True(water.SameAs(back.Molecule, 0.0));
        Assert.Equal(-76.4266738291, back.EnergyHartree);
    }

    [Fact]
    public void Extended_xyz_round_trip_keeps_charge_multiplicity_energy_and_keys()
    {
        var ion = new Molecule([Elements.O, Elements.H], [new Vec3(0, 0, 0), new Vec3(0, 0, 0.9697)], charge: 0, multiplicity: 2);
        var text = XyzWriter.ToExtendedText(ion, -75.72, [new("label", "hydroxyl radical = OH"), new("source", "a\"b")]);
        var back = XyzReader.Read(Utf8(text), "oh.xyz").GetValueOrThrow().Frames.Single();
        Assert.True(ion.SameAs(back.Molecule, 0.0));
        Assert.Equal(-75.72, back.EnergyHartree);
        Assert.Equal("hydroxyl radical = OH", back.Keys["label"]);
        Assert.Equal("a\"b", back.Keys["source"]);
    }

    [Fact]
    public void Writer_refuses_multi_line_comments() =>
        Assert.Throws<ArgumentException>(() => XyzWriter.ToText(Water(), null, "a\nb"));
}
