using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Reviews;

namespace BarrierLedger.Ledger.Tests.Export;

/// <summary>
/// A small invented study for the export tests: one verified, consistent step; one step whose saddle point awaits review;
/// one verified step whose barrier mixes levels of theory.
/// </summary>
internal static class ExportExamples
{
    /// <summary>kcal/mol per hartree, CODATA 2018 (E_h N_A / 4184 J): 627.509474 (NIST CODATA 2018 energy conversion table).</summary>
    public const double KcalPerHartreeCodata2018 = 627.509474;

    public static readonly ExportModel Model = new("wB97X-D/def2-TZVP (SMD, water)//B3LYP-D3/def2-SVP", 298.15,
        StandardState.Solution1Molar, ThermoTreatment.QuasiRrhoEntropy, 100, "none");

    public static BarrierRow Verified { get; } = new("R1 ring closure", "A → INT1", "TS1",
        Energy.FromHartree(0.041000), Energy.FromHartree(0.038500), Energy.FromHartree(0.039200), Energy.FromHartree(-0.012345),
        1.234e-5, Math.Log(2) / 1.234e-5, -512.4, Verdict.Passed, [], ReviewState.Verified, Model.LevelOfTheory, []);

    public static BarrierRow Unverified { get; } = new("R1 ring closure", "INT1 → P", "TS2",
        Energy.FromHartree(0.020000), Energy.FromHartree(0.018000), Energy.FromHartree(0.019000), Energy.FromHartree(-0.000040),
        2.5e3, Math.Log(2) / 2.5e3, -1210.6, Verdict.NeedsAttention, ["a second imaginary mode of 42i cm⁻¹ (methyl rotor)"],
        ReviewState.AwaitingReview, Model.LevelOfTheory, []);

    public static BarrierRow Inconsistent { get; } = new("R2 hydrolysis & co", "B + H2O → C", "TS3",
        Energy.FromHartree(0.030000), null, Energy.FromHartree(0.031000), Energy.FromHartree(0.002000),
        7.7e-11, Math.Log(2) / 7.7e-11, -350.0, Verdict.Passed, [], ReviewState.Verified, "mixed",
        ["energies come from two levels of theory (wB97X-D/def2-TZVP and B3LYP-D3/def2-SVP)"]);

    public static BarrierTableSource Source { get; } = new("Ring closures_50%", Model, [Verified, Unverified, Inconsistent]);

    public static TableOptions AllColumns { get; } = new(Enum.GetValues<ExportColumn>());

    public static BarrierTable Table(TableOptions? options = null) => BarrierTable.Build(Source, options ?? AllColumns);

    public static Molecule Water { get; } = new(
        [Elements.Get("O"), Elements.Get("H"), Elements.Get("H")],
        [new Vec3(0, 0, 0.1173), new Vec3(0, 0.7572, -0.4692), new Vec3(0, -0.7572, -0.4692)]);
}
