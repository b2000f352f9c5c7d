using System.Collections.Immutable;
using System.Globalization;
using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Vibrations;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Uploads;

namespace BarrierLedger.Ledger.Tests.Support;

/// <summary>
/// A small invented test system, H + H₂ → H₂ + H through a linear H···H···H saddle point. Geometries are plausible
/// (H–H 0.741 Å in H₂, 0.93 Å in the symmetric saddle point; from memory), energies are invented round numbers in the
/// right range, and the saddle point's imaginary mode is the antisymmetric stretch (outer atoms one way, the middle atom
/// twice as far the other way), so the check must find one significant imaginary mode moving both H–H pairs.
/// </summary>
public static class H3System
{
    public const string Level = "MODEL-A/basis-1";
    public const double EH2 = -1.1700;
    public const double EH = -0.5000;
    public const double ETs = -1.6550;

    public static Molecule H2 => new([Elements.H, Elements.H], [new Vec3(0, 0, 0), new Vec3(0.741, 0, 0)]);
    public static Molecule H => new([Elements.H], [new Vec3(0, 0, 0)], multiplicity: 2);
    public static Molecule Ts(double shift = 0) => new([Elements.H, Elements.H, Elements.H],
        [new Vec3(0, 0, 0), new Vec3(0.93 + shift, 0, 0), new Vec3(1.86, 0, 0)], multiplicity: 2);

    private static ImmutableArray<Vec3> Unit(params double[] xyz)
    {
        var n = Math.Sqrt(xyz.Sum(v => v * v));
        return [.. Enumerable.Range(0, xyz.Length / 3).Select(i => new Vec3(xyz[3 * i] / n, xyz[3 * i + 1] / n, xyz[3 * i + 2] / n))];
    }

    /// <summary>Antisymmetric stretch (imaginary), symmetric stretch, two bends.</summary>
    public static NormalMode[] TsModes(double imaginaryCm1 = -1500, double softCm1 = 0) =>
    [
        new(imaginaryCm1, Unit(1, 0, 0, -2, 0, 0, 1, 0, 0), 1.0, 1.0),
        .. softCm1 < 0 ? new NormalMode[] { new(softCm1, Unit(0, 1, 0, 0, -2, 0, 0, 1, 0), 1.0, 0.01) } : [],
        .. softCm1 < 0 ? [] : new NormalMode[] { new(900, Unit(0, 1, 0, 0, -2, 0, 0, 1, 0), 1.0, 0.5) },
        new(900, Unit(0, 0, 1, 0, 0, -2, 0, 0, 1), 1.0, 0.5),
        new(2000, Unit(1, 0, 0, 0, 0, 0, -1, 0, 0), 1.0, 2.0),
    ];

    public static DraftCalculation Calc(string label, string species, CalculationKind kind, Molecule? geometry, double? energy,
        IReadOnlyList<double>? freqs = null, IReadOnlyList<NormalMode>? modes = null, string level = Level, string? file = null) =>
        new(label, species, kind, LevelOfTheory.Parse(level), energy, geometry, freqs ?? [], modes ?? [], [], null, null, null, null, file, "");

    /// <summary>The whole pathway as a draft, as a bundle reader would give it.</summary>
    public static UploadDraft Draft(string study = "Hydrogen exchange (test)", string reaction = "H exchange", double tsEnergy = ETs,
        NormalMode[]? tsModes = null, string tsLabel = "ts", string manifestName = "h3.json", string level = Level)
    {
        var d = new UploadDraft { StudyName = study, PrimaryFile = manifestName };
        d.Files[manifestName] = Encoding.UTF8.GetBytes($"{{\"invented\":\"{study}/{reaction}/{tsLabel}/{tsEnergy.ToString(CultureInfo.InvariantCulture)}/{level}\"}}");
        d.Species.Add(new DraftSpecies("H2", 0, 1));
        d.Species.Add(new DraftSpecies("H", 0, 2));
        d.Species.Add(new DraftSpecies("TS", 0, 2));
        d.Calculations.Add(Calc("h2", "H2", CalculationKind.Minimum, H2, EH2, [4400], level: level));
        d.Calculations.Add(Calc("h", "H", CalculationKind.Minimum, H, EH, level: level));
        var modes = tsModes ?? TsModes();
        d.Calculations.Add(Calc(tsLabel, "TS", CalculationKind.SaddlePoint, Ts(), tsEnergy, [.. modes.Select(m => m.FrequencyCm1)], modes, level: level));
        d.Reactions.Add(new DraftReaction(reaction, "invented test pathway",
        [
            new DraftState("H2 + H", StateKind.Minimum, [new DraftTerm("H2", 1), new DraftTerm("H", 1)], null, []),
            new DraftState("TS", StateKind.SaddlePoint, [new DraftTerm("TS", 1)], tsLabel, [(1, 2), (2, 3)]),
            new DraftState("H + H2", StateKind.Minimum, [new DraftTerm("H", 1), new DraftTerm("H2", 1)], null, []),
        ]));
        return d;
    }

    /// <summary>An XYZ text of the saddle point (single structure).</summary>
    public static string TsXyz(double energy = ETs) =>
        $"3\nenergy={energy.ToString("R", CultureInfo.InvariantCulture)} multiplicity=2\nH 0 0 0\nH 0.93 0 0\nH 1.86 0 0\n";

    /// <summary>A large relaxed scan as multi-frame XYZ: <paramref name="frames"/> frames of a chain of <paramref name="atoms"/> atoms
    /// (alternating C and H so that the formula is fixed), the first C–C distance stretched, energies along a smooth invented curve.</summary>
    public static string ScanXyz(int frames, int atoms)
    {
        var sb = new StringBuilder(frames * atoms * 40);
        for (var f = 0; f < frames; f++)
        {
            var r = 1.5 + 1.5 * f / Math.Max(1, frames - 1);
            var e = -100.0 + 0.03 * Math.Sin(Math.PI * (r - 1.5) / 1.5);
            sb.Append(atoms).Append('\n').Append("energy=").Append(e.ToString("R", CultureInfo.InvariantCulture)).Append('\n');
            for (var a = 0; a < atoms; a++)
            {
                var x = a == 0 ? 0.0 : r + 1.1 * (a - 1);
                sb.Append(a % 2 == 0 ? "C" : "H").Append(' ')
                  .Append(x.ToString("F6", CultureInfo.InvariantCulture)).Append(' ')
                  .Append((a < 2 ? 0.0 : 0.3 * (a % 3)).ToString("F6", CultureInfo.InvariantCulture)).Append(" 0.000000\n");
            }
        }
        return sb.ToString();
    }

    public static UploadChoices ScanChoices(string study, string species = "chain", string? key = null) => new()
    {
        NewStudyName = study, SpeciesLabel = species, Kind = CalculationKind.RelaxedScan, LevelOfTheory = Level,
        ScanAtoms = [1, 2], Charge = 0, Multiplicity = 1, UploadKey = key,
    };
}
