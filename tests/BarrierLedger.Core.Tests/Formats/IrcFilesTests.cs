using BarrierLedger.Core.Formats;

namespace BarrierLedger.Core.Tests.Formats;

public class IrcFilesTests
{
    private static XyzDocument Xyz(string text) => XyzReader.ReadText(text, "irc.xyz").GetValueOrThrow();

    private const string Water = "O 0 0 0\nH 0.96 0 0\nH -0.24 0.93 0\n";
    private const string WaterOtherOrder = "H 0.96 0 0\nO 0 0 0\nH -0.24 0.93 0\n";

    [Fact]
    public void Path_every_frame_with_an_energy_is_read_in_order()
    {
        var r = IrcFiles.Path(Xyz($"3\nenergy=-76.40\n{Water}3\nenergy=-76.38\n{Water}3\n-76.41\n{Water}"), "irc.xyz");
        var v = r.GetValueOrThrow();
        Assert.Equal(IrcForm.Path, v.Form);
        Assert.Equal([-76.40, -76.38, -76.41], v.Structures.Select(s => s.EnergyHartree!.Value));
        Assert.Equal([1, 6, 11], v.Structures.Select(s => s.Line!.Value));
    }

    [Fact]
    public void Path_frame_without_energy_or_with_other_atom_order_is_an_error_at_its_line()
    {
        var r = IrcFiles.Path(Xyz($"3\nenergy=-76.40\n{Water}3\nno energy here\n{Water}3\nenergy=-76.41\n{WaterOtherOrder}"), "irc.xyz");
        Assert.False(r.Succeeded);
        Assert.Contains(r.Errors, e => e.Line == 6 && e.Message.Contains("frame 2") && e.Message.Contains("no energy"));
        Assert.Contains(r.Errors, e => e.Line == 11 && e.Message.Contains("frame 3 has H as atom 1, not O as in frame 1"));
    }

    [Fact]
    public void Path_of_one_frame_is_refused()
    {
        var r = IrcFiles.Path(Xyz($"3\nenergy=-76.40\n{Water}"), "irc.xyz");
        Assert.Contains(r.Errors, e => e.Message.Contains("at least 2 frames"));
    }

    [Fact]
    public void Endpoints_take_the_last_frame_of_each_and_must_list_the_same_atoms()
    {
        var fwd = Xyz($"3\nenergy=-76.30\n{Water}3\nenergy=-76.40\n{Water}");
        var ok = IrcFiles.Endpoints(fwd, "fwd.xyz", Xyz($"3\n\n{Water}"), "bwd.xyz").GetValueOrThrow();
        Assert.Equal(IrcForm.Endpoints, ok.Form);
        Assert.Equal(-76.40, ok.Structures[0].EnergyHartree);
        Assert.Null(ok.Structures[1].EnergyHartree);
        var bad = IrcFiles.Endpoints(fwd, "fwd.xyz", Xyz($"3\n\n{WaterOtherOrder}"), "bwd.xyz");
        var e = Assert.Single(bad.Errors);
        Assert.Equal("bwd.xyz", e.FileName);
        Assert.Contains("has H as atom 1, not O as in the forward end (fwd.xyz)", e.Message);
    }
}
