namespace BarrierLedger.Core.Units;

/// <summary>The energy units the trade uses for molecular energies (per molecule for hartree, eV and cm⁻¹; per mole for kcal/mol and kJ/mol).</summary>
public enum EnergyUnit
{
    Hartree,
    KcalPerMol,
    KJPerMol,
    ElectronVolt,
    Wavenumber,
}

/// <summary>
/// An energy stored in hartree. Arithmetic is only defined between <see cref="Energy"/> values,
/// so a number in kcal/mol cannot be added to one in hartree without saying which unit it is in.
/// Conversion factors derive from CODATA 2018 constants (<see cref="PhysicalConstants"/>):
/// 1 E_h = 627.509474 kcal/mol = 2625.499639 kJ/mol = 27.211386 eV = 219474.6314 cm⁻¹.
/// </summary>
public readonly record struct Energy(double Hartree) : IComparable<Energy>
{
    /// <summary>kcal/mol per hartree: E_h N_A / (4.184 J/cal × 1000).</summary>
    public const double KcalPerMolPerHartree =
        PhysicalConstants.HartreeJoule * PhysicalConstants.AvogadroPerMole / PhysicalConstants.ThermochemicalCalorieJoule / 1000.0;

    /// <summary>kJ/mol per hartree: E_h N_A / 1000.</summary>
    public const double KJPerMolPerHartree = PhysicalConstants.HartreeJoule * PhysicalConstants.AvogadroPerMole / 1000.0;

    /// <summary>eV per hartree: E_h / e.</summary>
    public const double ElectronVoltPerHartree = PhysicalConstants.HartreeJoule / PhysicalConstants.ElementaryChargeCoulomb;

    /// <summary>cm⁻¹ per hartree: E_h / (h c × 100 cm/m).</summary>
    public const double WavenumberPerHartree =
        PhysicalConstants.HartreeJoule / (PhysicalConstants.PlanckJouleSecond * PhysicalConstants.SpeedOfLightMetrePerSecond * 100.0);

    /// <summary>Zero energy.</summary>
    public static Energy Zero => new(0.0);

    /// <summary>An energy of <paramref name="value"/> hartree (per molecule).</summary>
    public static Energy FromHartree(double value) => new(value);
    /// <summary>An energy of <paramref name="value"/> kcal/mol (thermochemical calorie), stored as value / 627.5094740631 hartree.</summary>
    public static Energy FromKcalPerMol(double value) => new(value / KcalPerMolPerHartree);
    /// <summary>An energy of <paramref name="value"/> kJ/mol, stored as value / 2625.4996394799 hartree.</summary>
    public static Energy FromKJPerMol(double value) => new(value / KJPerMolPerHartree);
    /// <summary>An energy of <paramref name="value"/> eV, stored as value / 27.211386245988 hartree.</summary>
    public static Energy FromElectronVolt(double value) => new(value / ElectronVoltPerHartree);
    /// <summary>An energy of <paramref name="value"/> cm⁻¹ (E = h c ν̃), stored as value / 219474.6313632 hartree.</summary>
    public static Energy FromWavenumber(double value) => new(value / WavenumberPerHartree);

    /// <summary>An energy of <paramref name="value"/> in <paramref name="unit"/>.</summary>
    public static Energy From(double value, EnergyUnit unit) => new(value / FactorFromHartree(unit));

    /// <summary>The energy in kcal/mol (thermochemical calorie, 4.184 J).</summary>
    public double KcalPerMol => Hartree * KcalPerMolPerHartree;
    /// <summary>The energy in kJ/mol.</summary>
    public double KJPerMol => Hartree * KJPerMolPerHartree;
    /// <summary>The energy in eV.</summary>
    public double ElectronVolt => Hartree * ElectronVoltPerHartree;
    /// <summary>The energy in cm⁻¹ (ν̃ = E / (h c)).</summary>
    public double Wavenumber => Hartree * WavenumberPerHartree;

    /// <summary>The energy in <paramref name="unit"/>.</summary>
    public double In(EnergyUnit unit) => Hartree * FactorFromHartree(unit);

    /// <summary>How many of <paramref name="unit"/> make one hartree.</summary>
    public static double FactorFromHartree(EnergyUnit unit) => unit switch
    {
        EnergyUnit.Hartree => 1.0,
        EnergyUnit.KcalPerMol => KcalPerMolPerHartree,
        EnergyUnit.KJPerMol => KJPerMolPerHartree,
        EnergyUnit.ElectronVolt => ElectronVoltPerHartree,
        EnergyUnit.Wavenumber => WavenumberPerHartree,
        _ => throw new ArgumentOutOfRangeException(nameof(unit), unit, "Unknown energy unit."),
    };

    /// <summary>Display symbol of a unit, as written in tables.</summary>
    public static string Symbol(EnergyUnit unit) => unit switch
    {
        EnergyUnit.Hartree => "Eh",
        EnergyUnit.KcalPerMol => "kcal/mol",
        EnergyUnit.KJPerMol => "kJ/mol",
        EnergyUnit.ElectronVolt => "eV",
        EnergyUnit.Wavenumber => "cm⁻¹",
        _ => throw new ArgumentOutOfRangeException(nameof(unit), unit, "Unknown energy unit."),
    };

    /// <summary>Parses a unit as users write it ("hartree", "Eh", "au", "kcal/mol", "kJ/mol", "eV", "cm-1").</summary>
    public static bool TryParseUnit(string? text, out EnergyUnit unit)
    {
        var t = (text ?? "").Trim().ToLowerInvariant().Replace(" ", "");
        (bool ok, EnergyUnit u) r = t switch
        {
            "hartree" or "eh" or "au" or "a.u." or "ha" => (true, EnergyUnit.Hartree),
            "kcal/mol" or "kcalmol" or "kcal/mole" or "kcal" => (true, EnergyUnit.KcalPerMol),
            "kj/mol" or "kjmol" or "kj/mole" or "kj" => (true, EnergyUnit.KJPerMol),
            "ev" => (true, EnergyUnit.ElectronVolt),
            "cm-1" or "cm^-1" or "cm⁻¹" or "1/cm" or "wavenumber" => (true, EnergyUnit.Wavenumber),
            _ => (false, EnergyUnit.Hartree),
        };
        unit = r.u;
        return r.ok;
    }

    /// <summary>Sum (both in hartree).</summary>
    public static Energy operator +(Energy a, Energy b) => new(a.Hartree + b.Hartree);
    /// <summary>Difference (hartree).</summary>
    public static Energy operator -(Energy a, Energy b) => new(a.Hartree - b.Hartree);
    /// <summary>Negation.</summary>
    public static Energy operator -(Energy a) => new(-a.Hartree);
    /// <summary>Scaling by a dimensionless factor (e.g. a stoichiometric coefficient).</summary>
    public static Energy operator *(double s, Energy a) => new(s * a.Hartree);
    /// <summary>Scaling by a dimensionless factor.</summary>
    public static Energy operator *(Energy a, double s) => new(s * a.Hartree);
    /// <summary>Division by a dimensionless factor.</summary>
    public static Energy operator /(Energy a, double s) => new(a.Hartree / s);
    /// <summary>Comparison by value.</summary>
    public static bool operator <(Energy a, Energy b) => a.Hartree < b.Hartree;
    /// <summary>Comparison by value.</summary>
    public static bool operator >(Energy a, Energy b) => a.Hartree > b.Hartree;
    /// <summary>Comparison by value.</summary>
    public static bool operator <=(Energy a, Energy b) => a.Hartree <= b.Hartree;
    /// <summary>Comparison by value.</summary>
    public static bool operator >=(Energy a, Energy b) => a.Hartree >= b.Hartree;

    /// <summary>Orders by value in hartree.</summary>
    public int CompareTo(Energy other) => Hartree.CompareTo(other.Hartree);

    /// <summary>Round-trip text in hartree, e.g. "-76.4 Eh".</summary>
    public override string ToString() => $"{Hartree:R} Eh";
}
