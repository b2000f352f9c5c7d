namespace BarrierLedger.Core.Units;

/// <summary>
/// The units a barrier, a reaction energy or an energy diagram is reported in: kcal/mol, kJ/mol, eV and hartree, read the
/// same way by every export surface (the Export screen's downloads, the API and the command line) and by the CLI's rate
/// commands. A wavenumber (cm⁻¹) is refused: it is a unit for frequencies, and a barrier printed in cm⁻¹ reads like a
/// vibrational frequency in a table (common practice, no source: barriers are reported per mole or in eV).
/// </summary>
public static class BarrierUnits
{
    /// <summary>The unit when none is given.</summary>
    public const EnergyUnit Default = EnergyUnit.KcalPerMol;

    /// <summary>Every unit accepted, in the order they are listed to users.</summary>
    public static IReadOnlyList<EnergyUnit> All { get; } = [EnergyUnit.KcalPerMol, EnergyUnit.KJPerMol, EnergyUnit.ElectronVolt, EnergyUnit.Hartree];

    /// <summary>"kcal/mol, kJ/mol, eV or hartree".</summary>
    public const string Expected = "kcal/mol, kJ/mol, eV or hartree";

    /// <summary>
    /// Reads a unit as users write it (<see cref="Energy.TryParseUnit"/>: "kcal/mol", "kJ/mol", "eV", "hartree", "Eh"...) or by
    /// its name ("KcalPerMol", "KJPerMol", "ElectronVolt", "Hartree"), ignoring case; null or blank is <see cref="Default"/>.
    /// On failure <paramref name="problem"/> says why in a sentence that names the text given.
    /// </summary>
    public static bool TryParse(string? text, out EnergyUnit unit, out string problem)
    {
        problem = "";
        unit = Default;
        if (string.IsNullOrWhiteSpace(text)) return true;
        var t = text.Trim();
        var known = Energy.TryParseUnit(t, out unit)
            || (Enum.TryParse(t, ignoreCase: true, out unit) && Enum.IsDefined(unit) && t.All(char.IsAsciiLetter));
        if (!known)
        {
            unit = Default;
            problem = $"'{t}' is not an energy unit; expected {Expected}.";
            return false;
        }
        if (unit == EnergyUnit.Wavenumber)
        {
            unit = Default;
            problem = $"'{t}' is a wavenumber, which is not a unit for barriers or reaction energies; expected {Expected}.";
            return false;
        }
        return true;
    }
}
