using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Pathways;

/// <summary>An invented cycloaddition pathway: diene (C4H6) + ene (C2H4) → TS1 → adduct (C6H10). Energies are invented.</summary>
internal static class PathwayExamples
{
    public static readonly LevelOfTheory Level = LevelOfTheory.Parse("wB97X-D/def2-TZVP");
    public static readonly LevelOfTheory FreqLevel = LevelOfTheory.Parse("wB97X-D/def2-SVP");

    public static SpeciesRecord Species(string label, string formula, double hartree, LevelOfTheory? level = null, int multiplicity = 1, ThermalCorrection? thermal = null) =>
        new(label, Formula.Parse(formula), 0, multiplicity, Energy.FromHartree(hartree), level ?? Level, thermal);

    public static Pathway Cycloaddition(SpeciesRecord? replaceTs = null)
    {
        var diene = Species("diene", "C4H6", -155.90);
        var ene = Species("ene", "C2H4", -78.55);
        var ts = replaceTs ?? Species("TS1", "C6H10", -234.42);
        var adduct = Species("adduct", "C6H10", -234.52);
        return new Pathway("cycloaddition",
        [
            new("diene + ene", StateKind.Minimum, [new(diene), new(ene)]),
            new("TS1", StateKind.SaddlePoint, [new(ts)]),
            new("adduct", StateKind.Minimum, [new(adduct)]),
        ]);
    }
}
