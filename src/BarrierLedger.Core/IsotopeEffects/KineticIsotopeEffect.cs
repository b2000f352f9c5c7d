using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;
using ThermoCalc = BarrierLedger.Core.Thermochemistry.IdealGasThermo;

namespace BarrierLedger.Core.IsotopeEffects;

/// <summary>
/// Kinetic isotope effects from stored Cartesian Hessians, by transition-state theory with the full ideal-gas RRHO partition functions
/// (J. Bigeleisen and M. G. Mayer, J. Chem. Phys. 15, 261 (1947); J. Bigeleisen and M. Wolfsberg, Adv. Chem. Phys. 1, 15 (1958);
/// M. Wolfsberg, W. A. Van Hook and P. Paneth, Isotope Effects in the Chemical, Geological and Bio Sciences, Springer, 2010, ch. 4):
/// <code>KIE = k_p/k_s = (κ_p/κ_s) · [Q‡_p/Q‡_s] / Π_R [Q_R,p/Q_R,s]</code>
/// with p the parent isotopologue (the element table's isotopes, what every stored calculation uses) and s the substituted one.
/// Electronic energies cancel (Born–Oppenheimer), and so does the standard state. Each Hessian is analysed twice through
/// <see cref="FrequencyAnalysis.FromHessian"/>, once per set of masses (mass-weighted, re-projected, same eigensolver).
/// The ratio is reported factor by factor, as the literature does:
/// <list type="bullet">
/// <item>SYM = (σ_s/σ_p)‡ / Π_R (σ_s/σ_p): rotational symmetry numbers (1 unless a substitution changes σ);</item>
/// <item>MMI = (M_p/M_s)^{3/2} (I_A I_B I_C)_p^{1/2}/(I_A I_B I_C)_s^{1/2}, saddle point over reactants (masses and moments);</item>
/// <item>ZPE = exp[−Σ(u_p − u_s)/2], EXC = Π(1 − e^{−u_s})/(1 − e^{−u_p}), u = h c ν̃ / k_B T over real modes, saddle point over reactants
/// (the reaction-coordinate mode is left out of the saddle point's product, as transition-state theory does);</item>
/// <item>LOW: the model's low-mode treatment. Under quasi-RRHO the damping function is applied to each isotopologue's own wavenumbers
/// (a mode that shifts across the cut-off is weighted differently in each), through the same <see cref="ThermoCalc.Compute(VibrationalAnalysis, ThermoOptions)"/>
/// as every barrier; LOW = exp(−ΔΔG‡/RT) ÷ (SYM·MMI·ZPE·EXC), 1 under RRHO;</item>
/// <item>TUN = κ_p/κ_s of the model's tunnelling correction, each with its own imaginary frequency (and, for Bell and Skodje–Truhlar, its
/// own zero-point-corrected barrier).</item>
/// </list>
/// KIE = SYM · MMI · ZPE · EXC · LOW · TUN. By the Redlich–Teller product rule (O. Redlich, Z. Phys. Chem. B 28, 371 (1935)),
/// MMI = (ν̃‡_p/ν̃‡_s) · VP with VP the ratio of the real-mode frequency products; the rule's residual is reported for each structure as
/// a check of the Hessian (exactly 0 for a Hessian invariant to translation and rotation).
/// </summary>
public static class KineticIsotopeEffect
{
    /// <summary>Product-rule residual above which the notes warn that a Hessian is not invariant to rigid-body motion (common practice,
    /// no source: a stationary point's Hessian from a converged calculation meets the rule to 10⁻⁶ or better).</summary>
    public const double ProductRuleWarning = 1e-4;

    /// <summary>
    /// The KIE of one step: <paramref name="saddlePoint"/> with its substitutions and the reactant species that carry the same
    /// substituted atoms (species without a substituted atom cancel and are not needed). Throws <see cref="ArgumentException"/> when
    /// nothing is substituted, when the saddle point and the reactants substitute different isotopes (the atoms do not correspond),
    /// when the saddle point has no imaginary mode, or for a bad Hessian (<see cref="HessianException"/>).
    /// </summary>
    public static KieResult Compute(KieStructure saddlePoint, IReadOnlyList<KieStructure> reactants, KieOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(saddlePoint);
        ArgumentNullException.ThrowIfNull(reactants);
        options ??= new KieOptions();
        var t = options.TemperatureKelvin;
        if (!(t > 0) || !double.IsFinite(t)) throw new ArgumentException($"Temperature must be positive and finite, got {t} K.", nameof(options));
        CheckCorrespondence(saddlePoint, reactants);

        var notes = new List<string>();
        var ts = Analyse(saddlePoint, true, options, notes);
        var rs = reactants.Select(r => Analyse(r, false, options, notes)).ToArray();

        double Factor(Func<KieStructureResult, double> f) => f(ts) / rs.Aggregate(1.0, (a, r) => a * f(r));
        var sym = Factor(x => x.SymmetryRatio);
        var mmi = Factor(x => x.TranslationRotationRatio);
        var zpe = Factor(x => x.ZeroPointRatio);
        var exc = Factor(x => x.ExcitationRatio);
        var vp = Factor(x => x.FrequencyProductRatio);

        // The model's own Gibbs energies (quasi-RRHO when the model says so), per molecule: KIE_TST = exp(−ΔΔG‡ / k_B T).
        static double G(ThermoResult r) => r.GibbsCorrection.Hartree;
        var barrierParent = G(ts.ThermoParent) - rs.Sum(r => G(r.ThermoParent));
        var barrierSubstituted = G(ts.ThermoSubstituted) - rs.Sum(r => G(r.ThermoSubstituted));
        var kT = PhysicalConstants.BoltzmannJoulePerKelvin * t;
        var kieTst = Math.Exp(-(barrierParent - barrierSubstituted) * PhysicalConstants.HartreeJoule / kT);
        var low = kieTst / (sym * mmi * zpe * exc);

        var nuP = Math.Abs(ts.Parent.ImaginaryModes[0].FrequencyCm1);
        var nuS = Math.Abs(ts.Substituted.ImaginaryModes[0].FrequencyCm1);

        // Zero-point-corrected barriers of both isotopologues: the parent's from the options, the substituted one shifted by the
        // change of its zero-point energies (saddle point minus reactants; unsubstituted species cancel).
        static double Zpe(ThermoResult r) => r.ZeroPointEnergy.Hartree;
        var zpeShift = (Zpe(ts.ThermoSubstituted) - Zpe(ts.ThermoParent)) - rs.Sum(r => Zpe(r.ThermoSubstituted) - Zpe(r.ThermoParent));
        var tunnelling = TunnellingFactors(nuP, nuS, t, options, Energy.FromHartree(zpeShift), notes);
        var chosen = options.Tunnelling == KieTunnelling.None
            ? 1.0
            : tunnelling.Single(f => f.Correction == options.Tunnelling).Ratio
              ?? throw new ArgumentException(
                  $"The model's tunnelling correction ({options.Tunnelling}) does not apply here: {tunnelling.Single(f => f.Correction == options.Tunnelling).Note}",
                  nameof(options));

        var structures = ImmutableArray.Create([ts, .. rs]);
        var worst = structures.Max(s => double.IsNaN(s.ProductRuleDeviation) ? double.PositiveInfinity : s.ProductRuleDeviation);
        foreach (var s in structures.Where(s => !(s.ProductRuleDeviation <= ProductRuleWarning)))
            notes.Add($"{s.Label}: the Redlich–Teller product rule is off by {Fmt(s.ProductRuleDeviation)} (relative): its Hessian is not " +
                      "invariant to translation and rotation (not a stationary point, or rounded), so MMI and ν‡ ratio × VP disagree by that much; " +
                      "the KIE itself comes from the partition functions and does not use the rule.");
        if (options.Treatment != ThermoTreatment.Rrho)
            notes.Add($"Low modes: the model's quasi-RRHO treatment (cut-off {Fmt(options.QuasiRrhoCutoffCm1)} cm⁻¹) is applied to each isotopologue's own " +
                      "wavenumbers; what it changes against RRHO is the factor LOW.");
        notes.Add("Electronic energies and the standard state cancel in the ratio; ideal-gas RRHO partition functions, harmonic wavenumbers.");
        return new KieResult(options, kieTst * chosen, kieTst, sym, mmi, zpe, exc, low, chosen, nuP / nuS, vp, nuP, nuS,
            tunnelling, structures, worst, [.. notes.Distinct()]);
    }

    private static KieStructureResult Analyse(KieStructure s, bool isSaddlePoint, KieOptions options, List<string> notes)
    {
        ArgumentNullException.ThrowIfNull(s);
        ArgumentNullException.ThrowIfNull(s.Molecule);
        ArgumentNullException.ThrowIfNull(s.HessianHartreePerBohr2);
        if (s.SymmetryNumber < 1 || s.SubstitutedSymmetryNumber is < 1)
            throw new ArgumentException($"{s.Label}: symmetry numbers must be 1 or more.", nameof(s));
        var parentMasses = Inertia.MassesAmu(s.Molecule);
        var substitutedMasses = IsotopeSubstitution.Masses(s.Molecule, s.Substitutions);
        var parent = FrequencyAnalysis.FromHessian(s.Molecule, s.HessianHartreePerBohr2, new HessianOptions(Solver: options.Solver, MassesAmu: parentMasses));
        var substituted = FrequencyAnalysis.FromHessian(s.Molecule, s.HessianHartreePerBohr2, new HessianOptions(Solver: options.Solver, MassesAmu: substitutedMasses));
        var t = options.TemperatureKelvin;

        var imaginaryP = parent.ImaginaryModes.Length;
        var imaginaryS = substituted.ImaginaryModes.Length;
        if (isSaddlePoint)
        {
            if (imaginaryP == 0 || imaginaryS == 0)
                throw new ArgumentException($"{s.Label} has no imaginary mode{(imaginaryP == 0 ? "" : " in the substituted isotopologue")}: it is not a saddle point, so no rate constant and no KIE.", nameof(s));
            if (imaginaryP > 1)
                notes.Add($"{s.Label} has {imaginaryP} imaginary modes; the largest ({Fmt(-parent.ImaginaryModes[0].FrequencyCm1)}i cm⁻¹) is taken as the reaction coordinate and the others are left out of the products.");
        }
        else if (imaginaryP > 0)
        {
            notes.Add($"{s.Label} is a reactant with {imaginaryP} imaginary mode(s); they are left out of its products.");
        }
        if (imaginaryP != imaginaryS)
            notes.Add($"{s.Label}: the parent has {imaginaryP} imaginary mode(s) and the substituted isotopologue {imaginaryS}: a soft mode changes sign with the masses, which makes the ratio unreliable.");

        var kT = PhysicalConstants.BoltzmannJoulePerKelvin * t;
        var quantum = PhysicalConstants.PlanckJouleSecond * PhysicalConstants.SpeedOfLightMetrePerSecond * 100.0 / kT;
        // ln of the vibrational ratios over real modes (the reaction coordinate and any other imaginary mode are left out).
        double lnZpe = 0, lnExc = 0, lnProduct = 0;
        foreach (var v in parent.FrequenciesCm1.Where(v => v > 0))
        {
            var u = quantum * v;
            lnZpe -= 0.5 * u;
            lnExc -= Log1mExp(u);
            lnProduct += Math.Log(v);
        }
        foreach (var v in substituted.FrequenciesCm1.Where(v => v > 0))
        {
            var u = quantum * v;
            lnZpe += 0.5 * u;
            lnExc += Log1mExp(u);
            lnProduct -= Math.Log(v);
        }

        var shape = parent.Shape;
        var lnRotation = 0.0;
        double[]? momentsP = null, momentsS = null;
        if (shape != MolecularShape.Atom)
        {
            momentsP = Inertia.PrincipalAxes(s.Molecule, parentMasses).MomentsAmuAngstrom2;
            momentsS = Inertia.PrincipalAxes(s.Molecule, substitutedMasses).MomentsAmuAngstrom2;
            lnRotation = shape == MolecularShape.Linear
                ? Math.Log(momentsP[2] / momentsS[2])
                : 0.5 * (Math.Log(momentsP[0] / momentsS[0]) + Math.Log(momentsP[1] / momentsS[1]) + Math.Log(momentsP[2] / momentsS[2]));
        }
        var totalP = parentMasses.Sum();
        var totalS = substitutedMasses.Sum();
        var lnTranslation = 1.5 * Math.Log(totalP / totalS);

        // Redlich–Teller: Π(ν̃_s/ν̃_p) over all 3N − 6 (5) modes = Π_atoms (m_p/m_s)^{3/2} · (M_s/M_p)^{3/2} · rotation_s/rotation_p.
        var productRule = double.NaN;
        if (parent.Modes.Length == substituted.Modes.Length && parent.Modes.All(m => m.FrequencyCm1 != 0) && substituted.Modes.All(m => m.FrequencyCm1 != 0))
        {
            var lhs = 0.0;
            for (var i = 0; i < parent.Modes.Length; i++) lhs += Math.Log(Math.Abs(substituted.Modes[i].FrequencyCm1)) - Math.Log(Math.Abs(parent.Modes[i].FrequencyCm1));
            var rhs = -lnTranslation - lnRotation;
            for (var a = 0; a < parentMasses.Length; a++) rhs += 1.5 * Math.Log(parentMasses[a] / substitutedMasses[a]);
            productRule = Math.Abs(Math.Exp(lhs - rhs) - 1.0);
        }

        var sigmaP = s.SymmetryNumber;
        var sigmaS = s.SubstitutedSymmetryNumber ?? s.SymmetryNumber;
        var thermo = new ThermoOptions(t, Treatment: options.Treatment, QuasiRrhoCutoffCm1: options.QuasiRrhoCutoffCm1);
        var thermoP = ThermoCalc.Compute(parent, thermo with { SymmetryNumber = sigmaP });
        var thermoS = ThermoCalc.Compute(substituted, thermo with { SymmetryNumber = sigmaS });
        return new KieStructureResult(s.Label, isSaddlePoint, parent, substituted, Math.Exp(lnTranslation + lnRotation), (double)sigmaS / sigmaP,
            Math.Exp(lnZpe), Math.Exp(lnExc), Math.Exp(lnProduct), productRule, thermoP, thermoS);
    }

    private static ImmutableArray<KieTunnellingFactor> TunnellingFactors(
        double nuP, double nuS, double t, KieOptions options, Energy zpeShift, List<string> notes)
    {
        var wigner = new KieTunnellingFactor(KieTunnelling.Wigner, "Wigner", Tunnelling.Wigner(nuP, t), Tunnelling.Wigner(nuS, t), null);

        var crossover = Tunnelling.CrossoverTemperatureKelvin(Math.Max(nuP, nuS));
        KieTunnellingFactor bell;
        if (t <= crossover)
        {
            bell = new(KieTunnelling.Bell, "Bell", null, null,
                $"below the crossover temperature {Fmt(crossover)} K the parabolic model does not apply");
        }
        else if (options.ZeroPointBarrier is not { } v0)
        {
            bell = new(KieTunnelling.Bell, "Bell, infinite parabola (no barrier known)", Tunnelling.Bell(nuP, t), Tunnelling.Bell(nuS, t),
                "no barrier known: the infinite parabola, (u/2)/sin(u/2)");
        }
        else if (!(v0.Hartree > 0) || !(v0.Hartree + zpeShift.Hartree > 0))
        {
            bell = new(KieTunnelling.Bell, "Bell", null, null, "the zero-point-corrected barrier is not positive");
        }
        else
        {
            var terms = options.BellTerms;
            bell = new(KieTunnelling.Bell, $"Bell, truncated parabola, {terms} term{(terms == 1 ? "" : "s")} of the series",
                Tunnelling.Bell(nuP, t, v0, terms), Tunnelling.Bell(nuS, t, v0 + zpeShift, terms), null);
        }

        KieTunnellingFactor st;
        if (options.ZeroPointBarrier is not { } forward)
        {
            st = new(KieTunnelling.SkodjeTruhlar, "Skodje–Truhlar", null, null, "needs the step's zero-point-corrected barrier");
        }
        else
        {
            // Without a reverse barrier the step counts as not endoergic (V = 0). The product side's zero-point energies of the
            // substituted isotopologue are not known, so its reverse barrier moves with the forward one: the reaction energy is the parent's.
            var reverse = options.ZeroPointReverseBarrier ?? forward;
            if (options.ZeroPointReverseBarrier is null) notes.Add("Skodje–Truhlar: no reverse barrier given, so the step is treated as not endoergic.");
            st = forward.Hartree > 0 && forward.Hartree + zpeShift.Hartree > 0 && reverse.Hartree + zpeShift.Hartree > 0 && reverse.Hartree > 0
                ? new(KieTunnelling.SkodjeTruhlar, "Skodje–Truhlar",
                    Tunnelling.SkodjeTruhlar(nuP, forward, reverse, t), Tunnelling.SkodjeTruhlar(nuS, forward + zpeShift, reverse + zpeShift, t), null)
                : new(KieTunnelling.SkodjeTruhlar, "Skodje–Truhlar", null, null, "the zero-point-corrected barriers are not positive");
        }
        return [wigner, bell, st];
    }

    private static void CheckCorrespondence(KieStructure saddlePoint, IReadOnlyList<KieStructure> reactants)
    {
        if (saddlePoint.Substitutions.IsDefaultOrEmpty)
            throw new ArgumentException($"Nothing is substituted in {saddlePoint.Label}: give the atoms and their isotopes.", nameof(saddlePoint));
        static string Key(IEnumerable<IsotopeSubstitution> subs) =>
            string.Join(", ", subs.GroupBy(x => x.Isotope.Label).OrderBy(g => g.Key, StringComparer.Ordinal).Select(g => $"{g.Count()}×{g.Key}"));
        var ts = Key(saddlePoint.Substitutions);
        var reactantSubs = reactants.SelectMany(r => r.Substitutions.IsDefault ? [] : r.Substitutions).ToArray();
        var rs = Key(reactantSubs);
        if (ts != rs)
            throw new ArgumentException(
                $"The saddle point substitutes {ts} but the reactants {(rs.Length == 0 ? "nothing" : rs)}: the same atoms must be substituted on both sides of the step.",
                nameof(reactants));
    }

    /// <summary>ln(1 − e^{−u}) for u &gt; 0, accurate for small and large u.</summary>
    private static double Log1mExp(double u) => u < 0.6931 ? Math.Log(-ExpM1(-u)) : Math.Log(1.0 - Math.Exp(-u));

    private static double ExpM1(double x) => Math.Abs(x) < 1e-5 ? x + 0.5 * x * x + x * x * x / 6.0 : Math.Exp(x) - 1.0;

    private static string Fmt(double x) => x.ToString("G4", CultureInfo.InvariantCulture);
}
