using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.Tests.Checks;

public class SaddleCheckTests
{
    private static readonly (int, int)[] TransferBonds = [(1, 7), (7, 8)];

    [Fact]
    public void ClHCl_OneImaginaryStretch_Passes()
    {
        var r = SaddleCheck.Run(new(TestSystems.ClHCl(), TestSystems.ClHClModes(-1200), [(0, 1), (1, 2)]));
        Assert.Equal(Verdict.Passed, r.Verdict);
        var reason = Assert.Single(r.Reasons);
        Assert.Equal(SaddleCheckCodes.ReactionMode, reason.Code);
        Assert.Equal(ModeClass.Stretch, r.SignificantCharacter!.Class);
    }

    [Fact]
    public void SoftMethylRotor_NeedsAttention_NotFailed()
    {
        var m = TestSystems.HydrogenTransfer();
        var r = SaddleCheck.Run(new(m, TestSystems.HydrogenTransferModes(m, -1450, -45), TransferBonds));
        Assert.Equal(Verdict.NeedsAttention, r.Verdict);
        var soft = Assert.Single(r.SoftModes);
        Assert.True(soft.Character.RotorLike);
        var reason = Assert.Single(r.Reasons, x => x.Code == SaddleCheckCodes.SoftImaginaryMode);
        Assert.Contains("45i cm⁻¹", reason.Message);
        Assert.Contains("about C1–C2", reason.Message);
        Assert.Equal(ModeClass.Stretch, r.SignificantCharacter!.Class);
        Assert.Contains(r.SignificantCharacter.Leading(2), c => c.Label == "stretch C2–H8");
    }

    [Fact]
    public void NoImaginaryMode_Fails()
    {
        var m = TestSystems.HydrogenTransfer();
        var r = SaddleCheck.Run(new(m, TestSystems.HydrogenTransferModes(m, 1450, 45), TransferBonds));
        Assert.Equal(Verdict.Failed, r.Verdict);
        Assert.Equal(SaddleCheckCodes.NoImaginaryMode, r.Reasons[0].Code);
    }

    [Fact]
    public void OnlySoftImaginaryMode_Fails()
    {
        var m = TestSystems.HydrogenTransfer();
        var r = SaddleCheck.Run(new(m, TestSystems.HydrogenTransferModes(m, 1450, -45), TransferBonds));
        Assert.Equal(Verdict.Failed, r.Verdict);
        Assert.Equal(SaddleCheckCodes.NoSignificantImaginaryMode, r.Reasons[0].Code);
    }

    [Fact]
    public void TwoSignificantImaginaryModes_Fail()
    {
        var m = TestSystems.HydrogenTransfer();
        var r = SaddleCheck.Run(new(m, TestSystems.HydrogenTransferModes(m, -1450, -180), TransferBonds));
        Assert.Equal(Verdict.Failed, r.Verdict);
        Assert.Equal(SaddleCheckCodes.SeveralSignificantImaginaryModes, r.Reasons[0].Code);
        Assert.Equal(2, r.SignificantModes.Count);
    }

    [Fact]
    public void ThresholdIsASetting()
    {
        // The same −180 cm⁻¹ rotor is soft when the threshold is raised to 200 cm⁻¹.
        var m = TestSystems.HydrogenTransfer();
        var r = SaddleCheck.Run(new(m, TestSystems.HydrogenTransferModes(m, -1450, -180), TransferBonds), new SaddleCheckOptions(SignificantImaginaryCm1: 200));
        Assert.Equal(Verdict.NeedsAttention, r.Verdict);
    }

    [Fact]
    public void ModeThatMissesTheDeclaredBond_Fails()
    {
        // The declared reaction bond C1–C2 is not what the imaginary mode (the H8 transfer) moves.
        var m = TestSystems.HydrogenTransfer();
        var r = SaddleCheck.Run(new(m, TestSystems.HydrogenTransferModes(m, -1450, 45), [(0, 1)]));
        Assert.Equal(Verdict.Failed, r.Verdict);
        Assert.Equal(SaddleCheckCodes.ModeMissesReactionBond, r.Reasons[0].Code);
        Assert.Contains("C1–C2", r.Reasons[0].Message);
    }

    [Fact]
    public void NoReactionBondDeclared_NeedsAttention()
    {
        var m = TestSystems.HydrogenTransfer();
        var r = SaddleCheck.Run(new(m, TestSystems.HydrogenTransferModes(m, -1450, 45), []));
        Assert.Equal(Verdict.NeedsAttention, r.Verdict);
        Assert.Contains(r.Reasons, x => x.Code == SaddleCheckCodes.NoReactionBondDeclared);
    }

    [Theory]
    [InlineData(1.40, SaddleCheckCodes.NearScanMaximum, Verdict.Passed)]
    [InlineData(1.20, SaddleCheckCodes.FarFromScanMaximum, Verdict.NeedsAttention)]
    public void SaddleAgainstScanMaximum(double scanPeak, string code, Verdict verdict)
    {
        // A relaxed scan of C2–H8 every 0.05 Å with a parabolic top at scanPeak; the saddle geometry has C2–H8 = 1.40 Å.
        var m = TestSystems.HydrogenTransfer();
        var points = Enumerable.Range(0, 13).Select(i => 1.0 + 0.05 * i)
            .Select(x => new ScanPoint(x, -0.02 * (x - scanPeak) * (x - scanPeak))).ToList();
        var profile = ScanAnalysis.Analyze(points, new ScanCoordinate(ScanCoordinateKind.Distance, [1, 7]));
        var r = SaddleCheck.Run(new(m, TestSystems.HydrogenTransferModes(m, -1450, 45), TransferBonds, profile));
        Assert.Equal(verdict, r.Verdict);
        Assert.Contains(r.Reasons, x => x.Code == code);
        Assert.NotNull(r.Scan);
        Assert.Equal(1.40, r.Scan!.SaddleCoordinate, 9);
    }

    [Fact]
    public void WavenumbersWithoutDisplacements_CountsStillCheck_CharacterNeedsAttention()
    {
        var m = TestSystems.HydrogenTransfer();
        NormalMode[] modes = [new(-1450, []), new(300, []), new(980, [])];
        var r = SaddleCheck.Run(new(m, modes, TransferBonds));
        Assert.Equal(Verdict.NeedsAttention, r.Verdict);
        Assert.Contains(r.Reasons, x => x.Code == SaddleCheckCodes.ModeCharacterUnknown);
        Assert.Equal(ModeClass.Unknown, r.SignificantCharacter!.Class);
        NormalMode[] two = [new(-1450, []), new(-400, []), new(980, [])];
        Assert.Equal(Verdict.Failed, SaddleCheck.Run(new(m, two, TransferBonds)).Verdict);
    }

    [Theory]
    // A significant mode mixing the methyl turn with the H8 transfer: with a small transfer part the reaction stretches fall
    // below a quarter of the leading torsion's share and the check fails; with an equal part they lead and it does not.
    [InlineData(0.15, Verdict.Failed)]
    [InlineData(1.0, Verdict.Passed)]
    public void ReactionBondMustBeAmongTheLeadingComponents_RelativeToTheLargest(double transferWeight, Verdict expected)
    {
        var m = TestSystems.HydrogenTransfer();
        var rot = TestSystems.MethylRotation(m);
        var transfer = TestSystems.TransferDisplacement(m);
        var mixed = TestSystems.Normalised(rot.Zip(transfer, (a, b) => a + transferWeight * b));
        var r = SaddleCheck.Run(new(m, [new NormalMode(-600, mixed), new NormalMode(900, transfer)], TransferBonds));
        Assert.True(r.Verdict == expected, r.Report());
        Assert.Equal(expected == Verdict.Failed, r.Reasons.Any(x => x.Code == SaddleCheckCodes.ModeMissesReactionBond));
    }
}
