namespace BarrierLedger.Core.Chemistry;

public static partial class Elements
{
    // PLACEHOLDER: to be completed to H–Rn with sources.
    private static Element[] BuildTable()
    {
        var t = new Element[87];
        t[1] = new(1, "H", "Hydrogen", 1.008, 1.00782503223, 0.31);
        t[6] = new(6, "C", "Carbon", 12.011, 12.0, 0.76);
        t[7] = new(7, "N", "Nitrogen", 14.007, 14.00307400443, 0.71);
        t[8] = new(8, "O", "Oxygen", 15.999, 15.99491461957, 0.66);
        t[17] = new(17, "Cl", "Chlorine", 35.45, 34.968852682, 1.02);
        return t;
    }
}
