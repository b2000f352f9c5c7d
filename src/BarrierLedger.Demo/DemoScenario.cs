using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Demo;

/// <summary>
/// The demo study: an invented group's eight reactions, chosen so that together they show every check the tool makes.
/// All energies are invented (plausible magnitudes, stated as invented in the study description); Hessians come from
/// <see cref="ValenceForceField"/>.
/// <list type="bullet">
/// <item>DA: Diels–Alder of butadiene and ethylene. One clean imaginary mode on both forming C–C bonds and a clean relaxed scan:
/// the saddle point a reviewer can verify.</item>
/// <item>MT: methyl transfer from chloromethane to dimethylamine. Besides the reaction mode, both N-methyl groups turn with small
/// imaginary frequencies: needs attention.</item>
/// <item>IX: iodide-catalysed exchange of chloride for fluoride on a methyl group: two saddle points through iodomethane, the
/// iodide catalyst appearing in several states.</item>
/// <item>EL: elimination of hydrogen fluoride from fluoroethane, where the stored "saddle point" is the eclipsed rotamer: its imaginary mode is a
/// methyl turn that moves none of the declared bonds. Fails.</item>
/// <item>CB: conrotatory ring opening of cyclobutene; its relaxed scan has a jump where a CH2 group flips.</item>
/// <item>KE: 1,3-hydrogen shift from acetaldehyde to vinyl alcohol; vinyl alcohol comes from another protocol (def2-TZVP
/// geometry), so the reaction energy mixes levels of theory whichever energies the energy model takes. Its IRC connects both sides.</item>
/// <item>EO: acetaldehyde to oxirane as its owner drew it; the stored saddle point (found again from another guess) is the
/// 1,3-hydrogen shift of KE, and its IRC lands on vinyl alcohol, not oxirane. Fails.</item>
/// <item>BU: iodide displacing chloride from 1-chlorobutane, with 1-chlorobutane in five conformers and the saddle point in two:
/// the barrier is taken from the lowest reactant conformer, and every conformer check of issue 21 shows (<see cref="ConformerChecks"/>).</item>
/// </list>
/// </summary>
public static class DemoScenario
{
    public const string GeometryLevel = "wB97X-D/def2-SVP";
    public const string SinglePointLevel = "revDSD-PBEP86-D4/def2-QZVPP (PCM, acetonitrile)//wB97X-D/def2-SVP";
    /// <summary>The other protocol one state of KE was computed with (a larger basis for the geometry).</summary>
    public const string OtherGeometryLevel = "wB97X-D/def2-TZVP";
    public const string OtherSinglePointLevel = "revDSD-PBEP86-D4/def2-QZVPP (PCM, acetonitrile)//wB97X-D/def2-TZVP";

    public const string StudyName = "Demo study: small-molecule barriers (invented data)";

    public const string StudyDescription =
        "All data in this study are invented for the BarrierLedger demo. No calculation was run: geometries were built by hand from " +
        "standard bond lengths and angles, Hessians come from a small valence force field written for the demo, and energies are " +
        "made up within plausible ranges. No real person, group, paper or product is behind them. " +
        "Protocol as written on the calculations: geometries and Hessians at wB97X-D/def2-SVP in the gas phase; electronic energies " +
        "from single points at revDSD-PBEP86-D4/def2-QZVPP with a continuum model of acetonitrile. " +
        "The eight reactions are chosen to show every check: DA passes and can be verified; MT needs attention (two soft methyl " +
        "rotations); IX is a two-step pathway with a catalyst; EL fails (the stored saddle point is a rotamer); CB has a relaxed " +
        "scan with a jump; KE mixes levels of theory (vinyl alcohol was computed with def2-TZVP geometries) and its IRC connects " +
        "both sides; EO fails because the IRC of its saddle point lands on vinyl alcohol instead of the oxirane drawn; BU keeps " +
        "1-chlorobutane and its saddle point as conformer ensembles, so every conformer check shows.";

    private static double Kcal(double x) => Energy.FromKcalPerMol(x).Hartree;

    private static double R8(double x) => Math.Round(x, 8, MidpointRounding.ToEven);

    /// <summary>
    /// Invented difference between the gas-phase geometry level and the solvated single-point level, per element (hartree),
    /// plus a per-species term (kcal/mol) standing for solvation and method differences.
    /// </summary>
    internal static double OptEnergy(Molecule m, double singlePoint, double speciesKcal)
    {
        var shift = m.Elements.Sum(e => e.Symbol switch
        {
            "H" => 0.0061,
            "C" => 0.0978,
            "N" => 0.1302,
            "O" => 0.1497,
            "F" => 0.1751,
            "Cl" => 0.2296,
            "I" => 0.0412,
            _ => 0.1,
        });
        return R8(singlePoint + shift + Kcal(speciesKcal));
    }

    /// <summary>Builds the study.</summary>
    public static DemoStudy Build()
    {
        var species = new List<DemoSpecies>();
        DemoSpecies Add(string label, string slug, Molecule m, CalculationKind kind, ForceFieldSpec? ff, double sp, double solvKcal,
            string spLevel = SinglePointLevel, string note = "", string? geometryLevel = null, string? conformer = null, bool frequencies = true)
        {
            var s = new DemoSpecies(label, slug, m, kind, ff, OptEnergy(m, R8(sp), solvKcal), R8(sp), spLevel, note, geometryLevel, conformer, frequencies);
            species.Add(s);
            return s;
        }
        var min = CalculationKind.Minimum;
        var ts = CalculationKind.SaddlePoint;
        // A lone atom is trivially at its minimum; it has no Hessian (energy driver only).
        var atom = CalculationKind.Minimum;
        var plain = ForceFieldSpec.Minimum;

        // Invented single-point energies (hartree) of the reference minima; the others follow from invented reaction energies.
        const double ethylene = -78.4721, butadiene = -155.6652, dimethylamine = -134.8260, chloromethane = -499.6035,
            chloride = -460.2940, fluoride = -99.9300, iodide = -297.7900, fluoroethane = -178.8870, acetaldehyde = -153.7850;

        // DA: butadiene + ethylene → cyclohexene.
        Add("ethylene", "ethylene", DemoStructures.Ethylene, min, plain, ethylene, 1.1);
        Add("butadiene", "butadiene", DemoStructures.Butadiene, min, plain, butadiene, 1.6);
        Add("TS-DA", "ts-da", DemoStructures.DielsAlderSaddle, ts,
            new ForceFieldSpec(Reaction: [new ReactionCurvature([(0, 5, 1.0), (3, 4, 1.0)], -1.6)]),
            butadiene + ethylene + Kcal(23.6), 2.4);
        Add("cyclohexene", "cyclohexene", DemoStructures.Cyclohexene, min, plain, butadiene + ethylene + Kcal(-38.0), 1.5);

        // MT: dimethylamine + chloromethane → trimethylammonium + chloride (Menshutkin-type methyl transfer).
        Add("dimethylamine", "dimethylamine", DemoStructures.Dimethylamine, min, plain, dimethylamine, 4.1);
        Add("chloromethane", "chloromethane", DemoStructures.Chloromethane, min, plain, chloromethane, 2.2);
        Add("TS-MT", "ts-mt", DemoStructures.MenshutkinSaddle, ts,
            new ForceFieldSpec(
                Reaction: [new ReactionCurvature([(0, 1, 1.0), (1, 2, -1.0)], -1.2)],
                Torsions: [new TorsionCurvature(0, 6, -0.0030), new TorsionCurvature(0, 7, -0.0075)]),
            dimethylamine + chloromethane + Kcal(21.8), 14.5,
            note: "Both N-methyl groups turn with small imaginary frequencies; a tighter optimisation was planned.");
        Add("chloride", "chloride", DemoStructures.Chloride, atom, null, chloride, 72.0);
        Add("trimethylammonium", "trimethylammonium", DemoStructures.Trimethylammonium, min, plain,
            dimethylamine + chloromethane + Kcal(-9.0) - chloride, 58.0);

        // IX: CH3Cl + F⁻ + I⁻ → CH3I + Cl⁻ + F⁻ → CH3F + Cl⁻ + I⁻.
        Add("fluoride", "fluoride", DemoStructures.Fluoride, atom, null, fluoride, 101.0);
        Add("iodide", "iodide", DemoStructures.Iodide, atom, null, iodide, 58.5, note: "def2 basis with its effective core potential on iodine.");
        Add("TS-IX1", "ts-ix1", DemoStructures.IodideSaddle, ts,
            new ForceFieldSpec(Reaction: [new ReactionCurvature([(0, 2, 1.0), (0, 1, -1.0)], -0.9)]),
            chloromethane + iodide + Kcal(20.9), 52.0);
        var iodomethane = chloromethane + iodide + Kcal(3.1) - chloride;
        Add("iodomethane", "iodomethane", DemoStructures.Iodomethane, min, plain, iodomethane, 1.9);
        Add("TS-IX2", "ts-ix2", DemoStructures.FluorideSaddle, ts,
            new ForceFieldSpec(Reaction: [new ReactionCurvature([(0, 2, 1.0), (0, 1, -1.0)], -1.1)]),
            iodomethane + fluoride + Kcal(16.4), 70.0);
        Add("fluoromethane", "fluoromethane", DemoStructures.Fluoromethane, min, plain, chloromethane + fluoride + Kcal(-24.8) - chloride, 2.6);

        // EL: fluoroethane → ethylene + hydrogen fluoride; the stored saddle point is the eclipsed rotamer.
        Add("fluoroethane", "fluoroethane", DemoStructures.Fluoroethane(180), min, plain, fluoroethane, 2.3);
        Add("TS-EL", "ts-el", DemoStructures.Fluoroethane(0), ts,
            new ForceFieldSpec(Torsions: [new TorsionCurvature(0, 1, -0.105)]),
            fluoroethane + Kcal(3.2), 2.3,
            note: "Optimised from a guess with the methyl hydrogen eclipsing fluorine.");
        Add("hydrogen fluoride", "hydrogen-fluoride", DemoStructures.HydrogenFluoride, min, plain, fluoroethane + Kcal(16.0) - ethylene, 3.0);

        // CB: cyclobutene → butadiene.
        var cyclobutene = butadiene + Kcal(11.6);
        Add("cyclobutene", "cyclobutene", DemoStructures.Cyclobutene, min, plain, cyclobutene, 1.4);
        Add("TS-CB", "ts-cb", DemoStructures.CyclobuteneOpeningSaddle, ts,
            new ForceFieldSpec(Reaction: [new ReactionCurvature([(2, 3, 1.0)], -1.3)]),
            cyclobutene + Kcal(33.9), 1.2);

        // KE: acetaldehyde → vinyl alcohol; the product was computed with another protocol (def2-TZVP geometry, so another
        // optimisation energy and another single-point level). Its invented opt energy is 0.21 Eh (the larger basis) lower.
        Add("acetaldehyde", "acetaldehyde", DemoStructures.Acetaldehyde, min, plain, acetaldehyde, 3.4);
        Add("TS-KE", "ts-ke", DemoStructures.HydrogenShiftSaddle, ts,
            new ForceFieldSpec(Reaction: [new ReactionCurvature([(2, 3, 1.0), (1, 3, -1.0)], -1.6)]),
            acetaldehyde + Kcal(67.2), 3.9);
        Add("vinyl alcohol", "vinyl-alcohol", DemoStructures.VinylAlcohol, min, plain, acetaldehyde + Kcal(10.4) + Kcal(0.7), 0.8 - 131.8,
            spLevel: OtherSinglePointLevel, geometryLevel: OtherGeometryLevel,
            note: "Taken over from an earlier project that optimised with def2-TZVP; not yet recomputed with this study's protocol.");

        // EO: acetaldehyde → oxirane as drawn; the saddle point stored for it is KE's 1,3-hydrogen shift again (another guess,
        // another orientation), so its IRC lands on vinyl alcohol.
        Add("oxirane", "oxirane", DemoStructures.Oxirane, min, plain, acetaldehyde + Kcal(27.0), 2.0);
        Add("TS-EO", "ts-eo", Turned(DemoStructures.HydrogenShiftSaddle, 40.0), ts,
            new ForceFieldSpec(Reaction: [new ReactionCurvature([(2, 3, 1.0), (1, 3, -1.0)], -1.6)]),
            acetaldehyde + Kcal(67.25), 3.9,
            note: "Optimised from a guess with C2 close to O3, meant as the ring closure to oxirane.");

        // BU: iodide + 1-chlorobutane → 1-iodobutane + chloride, IX's first step on a butyl chain, with conformer ensembles
        // (τ1 = Cl5–C1–C2–C3, τ2 = C1–C2–C3–C4). Invented energies relative to the all-anti conformer, within the usual few tenths
        // of a kcal/mol per gauche turn (common practice, no source): g+g+ +1.55 (the one computed first), the mirror pair
        // g+a/g−a +0.30 (identical energies, as mirror images have), g+a again from another start +0.31 (a duplicate), and aa 0,
        // optimised but its frequencies not yet computed. The saddle point: chain anti (the checked one the state names) and
        // gauche +0.45, computed with frequencies but never checked.
        const double chlorobutane = -617.5327;
        const string again = "Optimised again from another starting structure; it converged to g+a.";
        Add("1-chlorobutane", "chlorobutane-gg", DemoStructures.Chlorobutane(65, 65), min, plain, chlorobutane + Kcal(1.55), 2.4,
            conformer: "g+g+", note: "The first conformer computed; the reaction was drawn from it.");
        Add("1-chlorobutane", "chlorobutane-ga-plus", DemoStructures.Chlorobutane(65, 180), min, plain, chlorobutane + Kcal(0.30), 2.4, conformer: "g+a");
        Add("1-chlorobutane", "chlorobutane-ga-minus", DemoStructures.Chlorobutane(-65, 180), min, plain, chlorobutane + Kcal(0.30), 2.4, conformer: "g−a");
        Add("1-chlorobutane", "chlorobutane-ga-again", DemoStructures.Chlorobutane(64.4, 179.3), min, plain, chlorobutane + Kcal(0.31), 2.4,
            conformer: "g+a (2)", note: again);
        Add("1-chlorobutane", "chlorobutane-aa", DemoStructures.Chlorobutane(180, 180), min, plain, chlorobutane, 2.4,
            conformer: "aa", frequencies: false, note: "Found by a later conformer search; optimised, frequencies not yet computed.");
        var buMode = new ForceFieldSpec(Reaction: [new ReactionCurvature([(0, 5, 1.0), (0, 4, -1.0)], -0.9)]);
        Add("TS-BU", "ts-bu-a", DemoStructures.ChlorobutaneIodideSaddle(180), ts, buMode, chlorobutane + iodide + Kcal(22.4), 52.0, conformer: "chain anti");
        Add("TS-BU", "ts-bu-g", DemoStructures.ChlorobutaneIodideSaddle(65), ts, buMode, chlorobutane + iodide + Kcal(22.85), 52.0, conformer: "chain g+",
            note: "Frequencies computed; not yet looked at.");
        Add("1-iodobutane", "iodobutane", DemoStructures.Iodobutane, min, plain, chlorobutane + iodide + Kcal(3.0) - chloride, 2.0);

        var reactions = new List<DemoReaction>
        {
            new("DA", "Diels–Alder cycloaddition of butadiene and ethylene (concerted, both C–C bonds form together). " +
                      "Shows a clean saddle point with a clean relaxed scan: ready to verify.",
            [
                DemoState.Minimum("butadiene + ethylene", "butadiene", "ethylene"),
                DemoState.Saddle("TS", "TS-DA", [], (1, 6), (4, 5)),
                DemoState.Minimum("cyclohexene", "cyclohexene"),
            ]),
            new("MT", "Methyl transfer from chloromethane to dimethylamine. The saddle point has two small imaginary frequencies from " +
                      "the N-methyl rotors besides the reaction mode: needs attention.",
            [
                DemoState.Minimum("dimethylamine + chloromethane", "dimethylamine", "chloromethane"),
                DemoState.Saddle("TS", "TS-MT", [], (1, 2), (2, 3)),
                DemoState.Minimum("trimethylammonium + chloride", "trimethylammonium", "chloride"),
            ]),
            new("IX", "Iodide-catalysed exchange of chloride for fluoride on a methyl group: iodide displaces chloride, then fluoride " +
                      "displaces iodide and the catalyst is released. Two saddle points through iodomethane.",
            [
                DemoState.Minimum("chloromethane + fluoride + iodide", "chloromethane", "fluoride", "iodide"),
                DemoState.Saddle("TS1", "TS-IX1", ["fluoride"], (1, 3), (1, 2)),
                DemoState.Minimum("iodomethane + chloride + fluoride", "iodomethane", "chloride", "fluoride"),
                DemoState.Saddle("TS2", "TS-IX2", ["chloride"], (1, 3), (1, 2)),
                DemoState.Minimum("fluoromethane + chloride + iodide", "fluoromethane", "chloride", "iodide"),
            ],
            // At room temperature this invented pathway converts well under 1 % in a day; a halide exchange like it would be run
            // warm, here at 80 °C overnight (the conditions are invented for the demo).
            RunKelvin: 353.15, RunHours: 24),
            new("EL", "Elimination of hydrogen fluoride from fluoroethane through a four-membered ring. The stored saddle point is the eclipsed " +
                      "rotamer: its imaginary mode turns the methyl group and moves none of the declared bonds, so the check fails.",
            [
                DemoState.Minimum("fluoroethane", "fluoroethane"),
                DemoState.Saddle("TS", "TS-EL", [], (1, 3), (2, 6), (3, 6)),
                DemoState.Minimum("ethylene + hydrogen fluoride", "ethylene", "hydrogen fluoride"),
            ]),
            new("CB", "Conrotatory ring opening of cyclobutene to butadiene. The relaxed scan along C3–C4 jumps between two points " +
                      "where a CH2 group flipped.",
            [
                DemoState.Minimum("cyclobutene", "cyclobutene"),
                DemoState.Saddle("TS", "TS-CB", [], (3, 4)),
                DemoState.Minimum("butadiene", "butadiene"),
            ]),
            new("KE", "1,3-hydrogen shift from acetaldehyde to vinyl alcohol (uncatalysed, high barrier). Vinyl alcohol was computed " +
                      "with another protocol (def2-TZVP geometry), so the reaction energy mixes levels of theory.",
            [
                DemoState.Minimum("acetaldehyde", "acetaldehyde"),
                DemoState.Saddle("TS", "TS-KE", [], (2, 4), (3, 4)),
                DemoState.Minimum("vinyl alcohol", "vinyl alcohol"),
            ]),
            new("EO", "Ring closure of acetaldehyde to oxirane as its owner drew it (H4 to C1, C2–O3 forming). The saddle point stored " +
                      "for it is the 1,3-hydrogen shift of KE found again: its IRC lands on vinyl alcohol, not oxirane, so the check fails.",
            [
                DemoState.Minimum("acetaldehyde", "acetaldehyde"),
                DemoState.Saddle("TS", "TS-EO", [], (2, 3), (2, 4), (1, 4)),
                DemoState.Minimum("oxirane", "oxirane"),
            ]),
            new("BU", "Iodide displaces chloride from 1-chlorobutane (the butyl version of IX's first step). 1-Chlorobutane is stored in " +
                      "five conformers (a lower one drawn first, a mirror-image pair, a duplicate, a lower one still without frequencies) and " +
                      "the saddle point in two, one never checked: every conformer check shows.",
            [
                DemoState.Minimum("1-chlorobutane + iodide", "1-chlorobutane", "iodide"),
                DemoState.Saddle("TS", "TS-BU", [], (1, 6), (1, 5)),
                DemoState.Minimum("1-iodobutane + chloride", "1-iodobutane", "chloride"),
            ]),
        };

        var byLabel = species.DistinctBy(s => s.Label).ToDictionary(s => s.Label);
        var scans = new List<DemoScan>
        {
            DielsAlderScan(byLabel["TS-DA"]),
            RingOpeningScan(byLabel["TS-CB"]),
        };
        // IRC energies at the geometry level; vinyl alcohol's there is invented (+11.1 kcal/mol over acetaldehyde), since its
        // stored optimisation is at the other protocol.
        var aldehyde = byLabel["acetaldehyde"].OptEnergyHartree;
        var enol = R8(aldehyde + Kcal(11.1));
        var ircs = new List<DemoIrc>
        {
            IrcPath("TS-KE IRC", "ts-ke-irc", byLabel["TS-KE"], DemoStructures.Acetaldehyde, aldehyde, DemoStructures.VinylAlcohol, enol),
            IrcPath("TS-EO IRC", "ts-eo-irc", byLabel["TS-EO"], DemoStructures.Acetaldehyde, aldehyde, DemoStructures.VinylAlcohol, enol),
        };
        return new DemoStudy(StudyName, StudyDescription, GeometryLevel, species, reactions, scans, ircs);
    }

    /// <summary>What each reaction is meant to show and the verdicts it is meant to get (tests check them independently).</summary>
    public static IReadOnlyList<(string Reaction, string Shows, string FrequencyCheck, string Consistency)> Intent { get; } =
    [
        ("DA", "clean saddle point with a clean relaxed scan (C1–C6, 3.2 → 1.9 Å)", "Passed: one imaginary mode on C1–C6 and C4–C5, at the scan maximum", "Passed"),
        ("MT", "soft imaginary modes from methyl rotors", "Needs attention: reaction mode on N1–C2/C2–Cl3 plus two small imaginary N-methyl turns", "Passed"),
        ("IX", "two-step pathway with a catalyst (iodide) in several states", "Passed for TS1 and TS2", "Passed"),
        ("EL", "a saddle point that is not the reaction", "Failed: the significant mode turns the methyl group; C1–F3, C2–H6, F3–H6 do not move", "Passed"),
        ("CB", "relaxed scan with a jump (C3–C4, between 2.6 and 2.7 Å a CH2 group flips)", "Passed (the scan is flagged, not the saddle point)", "Passed"),
        ("KE", "barrier mixing levels of theory (one state at another level); an IRC that connects both sides", "Passed: the IRC connects acetaldehyde and vinyl alcohol", "Failed: vinyl alcohol was optimised and single-pointed on def2-TZVP geometries"),
        ("EO", "an IRC that lands on another minimum than the one drawn", "Failed: the IRC connects acetaldehyde with vinyl alcohol (KE), not oxirane", "Passed"),
        ("BU", "conformer ensembles: a barrier taken from the lowest reactant conformer (g+a, 1.2 kcal/mol below the g+g+ drawn first), a " +
               "mirror-image pair, a duplicate, a lower conformer still without frequencies, an unchecked saddle-point conformer 0.45 kcal/mol " +
               "above the one used", "Passed for the saddle point the state names (anti chain); the gauche-chain one is not checked", "Passed"),
    ];

    /// <summary>
    /// The conformer checks (issue 21) the demo is meant to show, all on BU and nowhere else: reason code, and the energy-model
    /// conformer choice under which it appears (duplicates only matter in a Boltzmann sum).
    /// </summary>
    public static IReadOnlyList<(string Reaction, string Code, bool EnsembleOnly)> ConformerChecks { get; } =
    [
        ("BU", "conformers.lower-conformer-exists", false),
        ("BU", "conformers.unchecked-saddle-conformer", false),
        ("BU", "conformers.duplicates-in-ensemble", true),
    ];

    /// <summary>
    /// Isotopologue sets the demo loader stores after the upload (reaction label, saddle-point position, name, saddle-point atoms):
    /// KE breaks the C2–H4 bond in its only (so rate-determining) step, so H4→D gives a primary H/D isotope effect, and C2→¹³C a
    /// small heavy-atom one. The reactant-side atoms are found by atom order (acetaldehyde and TS-KE share their numbering).
    /// </summary>
    public static IReadOnlyList<(string Reaction, int SaddlePosition, string Name, string Substitutions)> IsotopologueSets { get; } =
    [
        ("KE", 1, "D at H4 (primary, the hydrogen that moves)", "4=D"),
        ("KE", 1, "13C at C2 (the carbon that loses H4)", "2=13C"),
    ];

    /// <summary>The README.md written beside the bundle.</summary>
    public static string Readme(DemoStudy study)
    {
        var sb = new System.Text.StringBuilder();
        sb.Append("# Demo study (invented data)\n\n");
        sb.Append(study.Description).Append("\n\n");
        sb.Append("Generated by `barrierledger demo generate --out seed-data` from `src/BarrierLedger.Demo/`; do not edit by hand ");
        sb.Append("(a test compares this folder with the generator output byte for byte).\n\n");
        sb.Append("| reaction | shows | frequency check | consistency |\n|---|---|---|---|\n");
        foreach (var (r, shows, freq, cons) in Intent) sb.Append($"| {r} | {shows} | {freq} | {cons} |\n");
        sb.Append("\nFiles: `bundle.json` (the manifest, see docs/formats.md), `structures/*.json` (QCSchema AtomicResult, hessian driver; ");
        sb.Append("energy driver for lone ions), `structures/*.sp.xyz` (single points, extended XYZ with energy=), `scans/*.xyz` ");
        sb.Append("(one frame per scan point, energy= on each).\n");
        return sb.ToString();
    }

    /// <summary>
    /// Invented relaxed-scan energy: E‡ − 0.35 kcal/mol at the saddle distance, falling off as sech² towards the reactant side
    /// (depth <paramref name="depthFar"/>) and the product side (depth <paramref name="depthNear"/>), kcal/mol.
    /// </summary>
    private static double ScanEnergy(double saddleEnergy, double d, double dSaddle, double width, double depthFar, double depthNear)
    {
        var x = (d - dSaddle) / width;
        var sech = 1 / Math.Cosh(x);
        var depth = d >= dSaddle ? depthFar : depthNear;
        return R8(saddleEnergy + Kcal(-0.35 - depth * (1 - sech * sech)));
    }

    /// <summary>The DA scan: C1–C6 from 3.2 to 1.9 Å in 0.1 Å steps, ethylene moved along the approach (both forming bonds equal).</summary>
    private static DemoScan DielsAlderScan(DemoSpecies saddle)
    {
        var points = new List<ScanPoint>();
        for (var k = 0; k <= 13; k++)
        {
            var d = Math.Round(3.2 - 0.1 * k, 2);
            var e = ScanEnergy(saddle.OptEnergyHartree, d, 2.27, 0.33, 22.0, 30.0);
            points.Add(new ScanPoint(d, e, true, DemoStructures.DielsAlder(d)));
        }
        return new DemoScan("DA scan C1–C6", "da-scan", saddle.Label, GeometryLevel, ScanCoordinateKind.Distance, [1, 6], points);
    }

    /// <summary>
    /// The CB scan: C3–C4 from 1.6 Å in 0.1 Å steps along a path through the saddle point (linear in Cartesians between the
    /// aligned ring, saddle point and s-cis-gauche butadiene, geminal hydrogens paired with their nearest partners). From 2.7 Å on,
    /// the CH2 group on C4 is turned by 35° and the energy is 6 kcal/mol lower: the jump the scan analysis must flag.
    /// </summary>
    private static DemoScan RingOpeningScan(DemoSpecies saddle)
    {
        var ts = saddle.Geometry;
        var ring = PairGeminal(Align(DemoStructures.Cyclobutene, ts), ts, [(6, 7), (8, 9)]);
        var open = PairGeminal(Align(DemoStructures.GaucheButadieneFromRing, ts), ts, [(6, 7), (8, 9)]);
        static double Dist(IReadOnlyList<Vec3> p) => (p[2] - p[3]).Length;
        var dTs = Dist(ts.PositionsAngstrom);
        var points = new List<ScanPoint>();
        for (var k = 0; ; k++)
        {
            var d = Math.Round(1.6 + 0.1 * k, 2);
            if (d > Dist(open) - 0.02) break;
            var (from, to) = d <= dTs ? (ring, ts.PositionsAngstrom.ToArray()) : (ts.PositionsAngstrom.ToArray(), open);
            double lo = 0, hi = 1;
            for (var it = 0; it < 60; it++)
            {
                var mid = 0.5 * (lo + hi);
                if (Dist(Lerp(from, to, mid)) < d) lo = mid; else hi = mid;
            }
            var pos = Lerp(from, to, 0.5 * (lo + hi));
            var jumped = d >= 2.7 - 1e-9;
            if (jumped) pos = TurnGroup(pos, 0, 3, [8, 9], 35.0);
            var e = ScanEnergy(saddle.OptEnergyHartree, d, dTs, 0.30, 38.0, 36.0) + (jumped ? Kcal(-6.0) : 0.0);
            var m = GeometryBuilder.Rounded(new Molecule(ts.Elements, pos, ts.Charge, ts.Multiplicity));
            points.Add(new ScanPoint(d, R8(e), true, m));
        }
        return new DemoScan("CB scan C3–C4", "cb-scan", saddle.Label, GeometryLevel, ScanCoordinateKind.Distance, [3, 4], points);
    }

    /// <summary>
    /// An invented IRC path of <paramref name="saddle"/>: <paramref name="perSide"/> frames on each side, linear in Cartesians between
    /// the saddle point and each end (superposed on it, geminal hydrogens on C2 paired), the ends exactly the given minima. Energy
    /// E‡ − (E‡ − E_end)·tanh²(2.5 t)/tanh²(2.5) at the fraction t of the way to an end, so the ends carry the minima's energies.
    /// </summary>
    private static DemoIrc IrcPath(string label, string slug, DemoSpecies saddle, Molecule start, double startEnergy, Molecule end, double endEnergy, int perSide = 20)
    {
        var ts = saddle.Geometry;
        var tsPos = ts.PositionsAngstrom.ToArray();
        var a = PairGeminal(Align(start, ts), ts, [(5, 6)]);
        var b = PairGeminal(Align(end, ts), ts, [(5, 6)]);
        double E(double t, double target) => R8(saddle.OptEnergyHartree - (saddle.OptEnergyHartree - target) * Math.Pow(Math.Tanh(2.5 * t) / Math.Tanh(2.5), 2));
        Molecule M(Vec3[] pos) => GeometryBuilder.Rounded(new Molecule(ts.Elements, pos, ts.Charge, ts.Multiplicity));
        var frames = new List<(Molecule, double)>();
        for (var k = perSide; k >= 1; k--) frames.Add((M(Lerp(tsPos, a, (double)k / perSide)), E((double)k / perSide, startEnergy)));
        frames.Add((ts, saddle.OptEnergyHartree));
        for (var k = 1; k <= perSide; k++) frames.Add((M(Lerp(tsPos, b, (double)k / perSide)), E((double)k / perSide, endEnergy)));
        return new DemoIrc(label, slug, saddle.Label, GeometryLevel, frames);
    }

    /// <summary>The molecule turned by <paramref name="degrees"/> about the z axis through the origin (the same structure, other coordinates).</summary>
    private static Molecule Turned(Molecule m, double degrees)
    {
        var t = degrees * Math.PI / 180;
        return GeometryBuilder.Rounded(new Molecule(m.Elements, m.PositionsAngstrom.Select(p => new Vec3(Math.Cos(t) * p.X - Math.Sin(t) * p.Y, Math.Sin(t) * p.X + Math.Cos(t) * p.Y, p.Z)), m.Charge, m.Multiplicity));
    }

    private static Vec3[] Align(Molecule mobile, Molecule reference) =>
        [.. Kabsch.Superpose(mobile.PositionsAngstrom, reference.PositionsAngstrom).AlignedAngstrom];

    /// <summary>Swaps each pair of geminal hydrogens when the swap brings them closer to their partners in <paramref name="reference"/>.</summary>
    private static Vec3[] PairGeminal(Vec3[] pos, Molecule reference, (int, int)[] pairs)
    {
        var r = reference.PositionsAngstrom;
        foreach (var (a, b) in pairs)
            if ((pos[a] - r[b]).LengthSquared + (pos[b] - r[a]).LengthSquared < (pos[a] - r[a]).LengthSquared + (pos[b] - r[b]).LengthSquared)
                (pos[a], pos[b]) = (pos[b], pos[a]);
        return pos;
    }

    private static Vec3[] Lerp(Vec3[] a, Vec3[] b, double t) => [.. a.Zip(b, (x, y) => x + t * (y - x))];

    /// <summary>Turns <paramref name="atoms"/> by <paramref name="degrees"/> about the axis from atom <paramref name="axisFrom"/> to <paramref name="axisTo"/> (Rodrigues).</summary>
    private static Vec3[] TurnGroup(Vec3[] pos, int axisFrom, int axisTo, int[] atoms, double degrees)
    {
        var result = (Vec3[])pos.Clone();
        var k = (pos[axisTo] - pos[axisFrom]).Normalized();
        var t = degrees * Math.PI / 180;
        foreach (var a in atoms)
        {
            var v = pos[a] - pos[axisTo];
            var rotated = Math.Cos(t) * v + Math.Sin(t) * k.Cross(v) + (1 - Math.Cos(t)) * k.Dot(v) * k;
            result[a] = pos[axisTo] + rotated;
        }
        return result;
    }
}
