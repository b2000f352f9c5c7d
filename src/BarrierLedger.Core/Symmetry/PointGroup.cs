using System.Globalization;

namespace BarrierLedger.Core.Symmetry;

/// <summary>The kinds of molecular point group, in Schoenflies notation (n is <see cref="PointGroup.N"/>).</summary>
public enum PointGroupFamily
{
    /// <summary>No symmetry but the identity.</summary>
    C1,
    /// <summary>One mirror plane.</summary>
    Cs,
    /// <summary>A centre of inversion only.</summary>
    Ci,
    /// <summary>One n-fold proper axis (n ≥ 2).</summary>
    Cn,
    /// <summary>Cn and n mirror planes containing the axis.</summary>
    Cnv,
    /// <summary>Cn and the mirror plane perpendicular to it.</summary>
    Cnh,
    /// <summary>An n-fold improper axis only (n even, ≥ 4; S2 is Ci).</summary>
    Sn,
    /// <summary>Cn and n two-fold axes perpendicular to it.</summary>
    Dn,
    /// <summary>Dn and n dihedral mirror planes between the two-fold axes.</summary>
    Dnd,
    /// <summary>Dn and the mirror plane perpendicular to the main axis.</summary>
    Dnh,
    T,
    Td,
    Th,
    O,
    Oh,
    I,
    Ih,
    /// <summary>Linear without a centre of inversion (HCN, CO).</summary>
    CInfinityV,
    /// <summary>Linear with a centre of inversion (CO₂, N₂).</summary>
    DInfinityH,
    /// <summary>A single atom (full rotation–reflection group).</summary>
    Kh,
}

/// <summary>
/// A molecular point group: its family and n (the order of the main axis for Cn, Cnv, Cnh, Dn, Dnd, Dnh; the order of the
/// improper axis for Sn; 0 otherwise), its Schoenflies <see cref="Name"/>, and the rotational symmetry number σ it implies.
/// <para>
/// σ is the number of proper rotations in the group (the pure-rotation subgroup), i.e. the number of ways the molecule can be
/// turned into an indistinguishable orientation: C1, Ci, Cs 1; Cn, Cnv, Cnh n; S2n n; Dn, Dnd, Dnh 2n; T, Td, Th 12; O, Oh 24;
/// I, Ih 60; C∞v 1; D∞h 2 (D. A. McQuarrie, Statistical Mechanics, 1976, ch. 8; A. Fernández-Ramos, B. A. Ellingson,
/// R. Meana-Pañeda, J. M. C. Marques and D. G. Truhlar, Theor. Chem. Acc. 2007, 118, 813, Table 1).
/// </para>
/// </summary>
public sealed record PointGroup
{
    public PointGroup(PointGroupFamily family, int n = 0)
    {
        var needsN = family is PointGroupFamily.Cn or PointGroupFamily.Cnv or PointGroupFamily.Cnh or PointGroupFamily.Dn or PointGroupFamily.Dnd or PointGroupFamily.Dnh;
        if (needsN && n < 2) throw new ArgumentException($"{family} needs an axis order of 2 or more, got {n} (use C1, Cs or Ci for order 1).", nameof(n));
        if (family == PointGroupFamily.Sn && (n < 4 || n % 2 != 0))
            throw new ArgumentException($"An improper-axis group S_n needs an even n of 4 or more, got {n} (S2 is Ci; S_n with odd n is C_nh).", nameof(n));
        if (!needsN && family != PointGroupFamily.Sn && n != 0) throw new ArgumentException($"{family} takes no axis order, got {n}.", nameof(n));
        Family = family;
        N = n;
    }

    public PointGroupFamily Family { get; }

    /// <summary>Order of the main (or improper) axis; 0 for groups without one.</summary>
    public int N { get; }

    /// <summary>Schoenflies symbol: "C2v", "D3h", "S4", "Td", "C∞v".</summary>
    public string Name => Family switch
    {
        PointGroupFamily.Cn => $"C{I(N)}",
        PointGroupFamily.Cnv => $"C{I(N)}v",
        PointGroupFamily.Cnh => $"C{I(N)}h",
        PointGroupFamily.Sn => $"S{I(N)}",
        PointGroupFamily.Dn => $"D{I(N)}",
        PointGroupFamily.Dnd => $"D{I(N)}d",
        PointGroupFamily.Dnh => $"D{I(N)}h",
        PointGroupFamily.CInfinityV => "C∞v",
        PointGroupFamily.DInfinityH => "D∞h",
        _ => Family.ToString(),
    };

    /// <summary>Rotational symmetry number σ (see the type's summary for the table and its sources).</summary>
    public int SymmetryNumber => Family switch
    {
        PointGroupFamily.C1 or PointGroupFamily.Cs or PointGroupFamily.Ci or PointGroupFamily.CInfinityV or PointGroupFamily.Kh => 1,
        PointGroupFamily.Cn or PointGroupFamily.Cnv or PointGroupFamily.Cnh => N,
        PointGroupFamily.Sn => N / 2,
        PointGroupFamily.Dn or PointGroupFamily.Dnd or PointGroupFamily.Dnh => 2 * N,
        PointGroupFamily.T or PointGroupFamily.Td or PointGroupFamily.Th => 12,
        PointGroupFamily.O or PointGroupFamily.Oh => 24,
        PointGroupFamily.I or PointGroupFamily.Ih => 60,
        PointGroupFamily.DInfinityH => 2,
        _ => throw new InvalidOperationException($"No symmetry number for {Family}."),
    };

    /// <summary>Number of symmetry operations (the group order); <see cref="int.MaxValue"/> for the infinite groups of linear molecules and atoms.</summary>
    public int Order => Family switch
    {
        PointGroupFamily.C1 => 1,
        PointGroupFamily.Cs or PointGroupFamily.Ci => 2,
        PointGroupFamily.Cn or PointGroupFamily.Sn => N,
        PointGroupFamily.Cnv or PointGroupFamily.Cnh or PointGroupFamily.Dn => 2 * N,
        PointGroupFamily.Dnd or PointGroupFamily.Dnh => 4 * N,
        PointGroupFamily.T => 12,
        PointGroupFamily.Td or PointGroupFamily.Th or PointGroupFamily.O => 24,
        PointGroupFamily.Oh => 48,
        PointGroupFamily.I => 60,
        PointGroupFamily.Ih => 120,
        _ => int.MaxValue,
    };

    /// <summary>
    /// True when the group has proper rotations only (C1, Cn, Dn, T, O, I): the molecule is not superimposable on its mirror
    /// image, so it exists as a pair of enantiomers.
    /// </summary>
    public bool IsChiral => Family is PointGroupFamily.C1 or PointGroupFamily.Cn or PointGroupFamily.Dn or PointGroupFamily.T or PointGroupFamily.O or PointGroupFamily.I;

    /// <summary>True for C∞v and D∞h.</summary>
    public bool IsLinear => Family is PointGroupFamily.CInfinityV or PointGroupFamily.DInfinityH;

    public static PointGroup C1 { get; } = new(PointGroupFamily.C1);

    public override string ToString() => Name;

    /// <summary>Reads a Schoenflies symbol as <see cref="Name"/> writes it ("C2v", "S4", "D∞h"; "Cinfv"/"Dinfh" also accepted).</summary>
    public static bool TryParse(string? text, out PointGroup group)
    {
        group = C1;
        var t = (text ?? "").Trim().Replace("inf", "∞", StringComparison.OrdinalIgnoreCase);
        if (t.Length == 0) return false;
        PointGroupFamily? fixedFamily = t switch
        {
            "C1" => PointGroupFamily.C1,
            "Cs" => PointGroupFamily.Cs,
            "Ci" => PointGroupFamily.Ci,
            "T" => PointGroupFamily.T,
            "Td" => PointGroupFamily.Td,
            "Th" => PointGroupFamily.Th,
            "O" => PointGroupFamily.O,
            "Oh" => PointGroupFamily.Oh,
            "I" => PointGroupFamily.I,
            "Ih" => PointGroupFamily.Ih,
            "C∞v" => PointGroupFamily.CInfinityV,
            "D∞h" => PointGroupFamily.DInfinityH,
            "Kh" => PointGroupFamily.Kh,
            _ => null,
        };
        if (fixedFamily is { } f)
        {
            group = new PointGroup(f);
            return true;
        }
        if (t.Length < 2 || t[0] is not ('C' or 'D' or 'S')) return false;
        var digits = new string([.. t.Skip(1).TakeWhile(char.IsAsciiDigit)]);
        var suffix = t[(1 + digits.Length)..];
        if (digits.Length == 0 || !int.TryParse(digits, NumberStyles.None, CultureInfo.InvariantCulture, out var n)) return false;
        PointGroupFamily? family = (t[0], suffix) switch
        {
            ('C', "") => PointGroupFamily.Cn,
            ('C', "v") => PointGroupFamily.Cnv,
            ('C', "h") => PointGroupFamily.Cnh,
            ('D', "") => PointGroupFamily.Dn,
            ('D', "d") => PointGroupFamily.Dnd,
            ('D', "h") => PointGroupFamily.Dnh,
            ('S', "") => PointGroupFamily.Sn,
            _ => null,
        };
        if (family is null) return false;
        try
        {
            group = new PointGroup(family.Value, n);
            return true;
        }
        catch (ArgumentException)
        {
            return false;
        }
    }

    private static string I(int n) => n.ToString(CultureInfo.InvariantCulture);
}
