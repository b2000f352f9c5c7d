using System.Globalization;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// Writes XYZ and extended XYZ. Coordinates are written with round-trip precision ("R"), so reading the file back
/// gives the same numbers bit for bit.
/// </summary>
public static class XyzWriter
{
    /// <summary>Plain XYZ: atom count, the comment (the energy in hartree as a bare number when given, else <paramref name="comment"/>), atoms.</summary>
    public static void Write(TextWriter writer, Molecule molecule, double? energyHartree = null, string comment = "")
    {
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(molecule);
        if (comment.Contains('\n') || comment.Contains('\r') || comment.Contains('\0'))
            throw new ArgumentException("The comment must be one line of text (no line breaks or NUL).", nameof(comment));
        writer.Write(molecule.AtomCount.ToString(CultureInfo.InvariantCulture));
        writer.Write('\n');
        writer.Write(energyHartree is { } e ? Numbers.Format(e) : comment);
        writer.Write('\n');
        WriteAtoms(writer, molecule);
    }

    /// <summary>
    /// Extended XYZ: <c>Properties=species:S:1:pos:R:3</c>, <c>charge</c>, <c>multiplicity</c>, <c>energy</c> (hartree) when given,
    /// then any <paramref name="extraKeys"/> (quoted when needed).
    /// </summary>
    public static void WriteExtended(TextWriter writer, Molecule molecule, double? energyHartree = null,
        IEnumerable<KeyValuePair<string, string>>? extraKeys = null)
    {
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(molecule);
        var parts = new List<string>
        {
            "Properties=species:S:1:pos:R:3",
            $"charge={molecule.Charge.ToString(CultureInfo.InvariantCulture)}",
            $"multiplicity={molecule.Multiplicity.ToString(CultureInfo.InvariantCulture)}",
        };
        if (energyHartree is { } e) parts.Add($"energy={Numbers.Format(e)}");
        foreach (var (k, v) in extraKeys ?? [])
        {
            if (k.Length == 0 || k.Any(c => char.IsWhiteSpace(c) || c is '=' or '"'))
                throw new ArgumentException($"Key '{k}' cannot be written: keys must be non-empty without spaces, '=' or quotes.", nameof(extraKeys));
            if (v.Contains('\n') || v.Contains('\r') || v.Contains('\0'))
                throw new ArgumentException($"Value of '{k}' must be one line of text (no line breaks or NUL).", nameof(extraKeys));
            parts.Add($"{k}={KeyValueLine.FormatValue(v)}");
        }
        writer.Write(molecule.AtomCount.ToString(CultureInfo.InvariantCulture));
        writer.Write('\n');
        writer.Write(string.Join(' ', parts));
        writer.Write('\n');
        WriteAtoms(writer, molecule);
    }

    private static void WriteAtoms(TextWriter writer, Molecule molecule)
    {
        for (var i = 0; i < molecule.AtomCount; i++)
        {
            var p = molecule.PositionsAngstrom[i];
            writer.Write($"{molecule.Elements[i].Symbol,-2} {Numbers.Format(p.X)} {Numbers.Format(p.Y)} {Numbers.Format(p.Z)}\n");
        }
    }

    public static string ToText(Molecule molecule, double? energyHartree = null, string comment = "")
    {
        var sw = new StringWriter(CultureInfo.InvariantCulture);
        Write(sw, molecule, energyHartree, comment);
        return sw.ToString();
    }

    public static string ToExtendedText(Molecule molecule, double? energyHartree = null, IEnumerable<KeyValuePair<string, string>>? extraKeys = null)
    {
        var sw = new StringWriter(CultureInfo.InvariantCulture);
        WriteExtended(sw, molecule, energyHartree, extraKeys);
        return sw.ToString();
    }
}
