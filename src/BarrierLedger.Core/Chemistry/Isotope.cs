namespace BarrierLedger.Core.Chemistry;

/// <summary>Where the mass of an <see cref="Isotope"/> comes from (see <see cref="Isotopes"/> for the references).</summary>
public enum MassSource
{
    /// <summary>The most abundant (or, without stable isotopes, the longest-lived) isotope: the mass of the element table
    /// (<see cref="Element.MostAbundantIsotopeMassDa"/>, AME2016, equal to AME2020 to the digits given), so the parent isotopologue
    /// has exactly the masses of every other vibrational analysis in the ledger.</summary>
    ElementTable,
    /// <summary>Atomic Mass Evaluation 2020 (W. J. Huang, M. Wang, F. G. Kondev, G. Audi, S. Naimi, Chin. Phys. C 45, 030002 (2021)).</summary>
    Ame2020,
    /// <summary>Atomic Mass Evaluation 2003 (G. Audi, A. H. Wapstra, C. Thibault, Nucl. Phys. A 729, 337 (2003)); later evaluations
    /// moved these masses by less than 10⁻⁵ Da, a relative change in a vibrational frequency below 10⁻⁵.</summary>
    Ame2003,
}

/// <summary>
/// One nuclide as an atom: element, mass number and the atomic mass (nucleus and electrons) in Da (unified atomic mass units).
/// </summary>
/// <param name="AtomicNumber">Z.</param>
/// <param name="MassNumber">A, the number of nucleons.</param>
/// <param name="MassDa">Atomic mass in Da.</param>
/// <param name="NaturalAbundancePercent">Isotopic composition of the natural element in percent (IUPAC representative values as
/// tabulated by K. J. R. Rosman and P. D. P. Taylor, Pure Appl. Chem. 70, 217 (1998)); 0 for a radioactive label such as ³H or ¹⁴C.</param>
/// <param name="Source">Which evaluation the mass comes from.</param>
public sealed record Isotope(int AtomicNumber, int MassNumber, double MassDa, double NaturalAbundancePercent, MassSource Source)
{
    /// <summary>The element.</summary>
    public Element Element => Elements.Get(AtomicNumber);

    /// <summary>"13C", "2H", "37Cl": mass number then symbol, the way a user types it.</summary>
    public string Label => $"{MassNumber}{Element.Symbol}";

    /// <summary>"¹³C", "²H": with a superscript mass number, for screens and exports.</summary>
    public string DisplayLabel => string.Concat(MassNumber.ToString(System.Globalization.CultureInfo.InvariantCulture).Select(Superscript)) + Element.Symbol;

    /// <summary>D for ²H and T for ³H, otherwise <see cref="Label"/>.</summary>
    public string ShortLabel => (AtomicNumber, MassNumber) switch { (1, 2) => "D", (1, 3) => "T", _ => Label };

    /// <summary>True for the isotope whose mass the element table (and so every ordinary frequency analysis) uses.</summary>
    public bool IsParent => Source == MassSource.ElementTable;

    public override string ToString() => Label;

    private static char Superscript(char digit) => "⁰¹²³⁴⁵⁶⁷⁸⁹"[digit - '0'];
}
