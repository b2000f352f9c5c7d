namespace BarrierLedger.Core.Chemistry;

/// <summary>
/// A chemical element.
/// </summary>
/// <param name="AtomicNumber">Z.</param>
/// <param name="Symbol">IUPAC symbol, e.g. "Cl".</param>
/// <param name="Name">English name.</param>
/// <param name="StandardAtomicWeight">Conventional standard atomic weight (IUPAC), for molar masses.</param>
/// <param name="MostAbundantIsotopeMassDa">Mass of the most abundant isotope in Da (AME), what frequency calculations use.</param>
/// <param name="CovalentRadiusAngstrom">Single-bond covalent radius in Å (Cordero et al., Dalton Trans. 2008, 2832).</param>
public sealed record Element(
    int AtomicNumber,
    string Symbol,
    string Name,
    double StandardAtomicWeight,
    double MostAbundantIsotopeMassDa,
    double CovalentRadiusAngstrom)
{
    public override string ToString() => Symbol;
}
