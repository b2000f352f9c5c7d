using System.Buffers.Binary;
using System.Collections.Immutable;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Ledger.Storage;

/// <summary>
/// Compact, portable encodings of the arrays a calculation carries: IEEE-754 doubles in little-endian order (8 bytes each),
/// atomic numbers one byte each. Readable by any language without this code.
/// </summary>
public static class Blobs
{
    public static byte[] FromDoubles(ReadOnlySpan<double> values)
    {
        var bytes = new byte[values.Length * 8];
        for (var i = 0; i < values.Length; i++) BinaryPrimitives.WriteDoubleLittleEndian(bytes.AsSpan(i * 8), values[i]);
        return bytes;
    }

    public static double[] ToDoubles(byte[]? bytes)
    {
        if (bytes is null || bytes.Length == 0) return [];
        if (bytes.Length % 8 != 0) throw new InvalidDataException($"A double array blob has {bytes.Length} bytes, not a multiple of 8.");
        var values = new double[bytes.Length / 8];
        for (var i = 0; i < values.Length; i++) values[i] = BinaryPrimitives.ReadDoubleLittleEndian(bytes.AsSpan(i * 8));
        return values;
    }

    public static byte[] FromPositions(IReadOnlyList<Vec3> positions)
    {
        var values = new double[positions.Count * 3];
        for (var i = 0; i < positions.Count; i++)
        {
            values[3 * i] = positions[i].X;
            values[3 * i + 1] = positions[i].Y;
            values[3 * i + 2] = positions[i].Z;
        }
        return FromDoubles(values);
    }

    public static Vec3[] ToPositions(byte[]? bytes)
    {
        var v = ToDoubles(bytes);
        if (v.Length % 3 != 0) throw new InvalidDataException($"A position blob holds {v.Length} numbers, not a multiple of 3.");
        var p = new Vec3[v.Length / 3];
        for (var i = 0; i < p.Length; i++) p[i] = new Vec3(v[3 * i], v[3 * i + 1], v[3 * i + 2]);
        return p;
    }

    public static byte[] FromElements(IEnumerable<Element> elements) => [.. elements.Select(e => checked((byte)e.AtomicNumber))];

    public static Element[] ToElements(byte[]? bytes) => bytes is null ? [] : [.. bytes.Select(z => Elements.Get(z))];

    /// <summary>
    /// Modes as M blocks of 3N displacement components, each block preceded by its wavenumber, reduced mass (Da) and force constant.
    /// The force constant is kept in the blob in mdyn/Å, the unit ledgers were first written with, so stored ledgers read back
    /// unchanged; it is converted here, at the store's edge (1 mdyn/Å = 100 N/m exactly), and nowhere else.
    /// </summary>
    public static byte[] FromModes(IReadOnlyList<NormalMode> modes)
    {
        if (modes.Count == 0) return [];
        var n = modes[0].DisplacementCartesian.Length;
        var values = new double[modes.Count * (3 + 3 * n)];
        var k = 0;
        foreach (var m in modes)
        {
            if (m.DisplacementCartesian.Length != n) throw new ArgumentException("Every mode must cover the same atoms.", nameof(modes));
            values[k++] = m.FrequencyCm1;
            values[k++] = m.ReducedMassDalton;
            values[k++] = m.ForceConstantNewtonPerMetre / NewtonPerMetrePerMdynPerAngstrom;
            foreach (var d in m.DisplacementCartesian) { values[k++] = d.X; values[k++] = d.Y; values[k++] = d.Z; }
        }
        return FromDoubles(values);
    }

    /// <summary>1 mdyn/Å = 10⁻⁸ N / 10⁻¹⁰ m = 100 N/m (exact, by the definitions of the dyne and the ångström).</summary>
    private const double NewtonPerMetrePerMdynPerAngstrom = 100.0;

    public static NormalMode[] ToModes(byte[]? bytes, int atomCount)
    {
        var v = ToDoubles(bytes);
        if (v.Length == 0) return [];
        var block = 3 + 3 * atomCount;
        if (atomCount <= 0 || v.Length % block != 0)
            throw new InvalidDataException($"A mode blob of {v.Length} numbers does not fit {atomCount} atoms.");
        var modes = new NormalMode[v.Length / block];
        for (var m = 0; m < modes.Length; m++)
        {
            var o = m * block;
            var d = ImmutableArray.CreateBuilder<Vec3>(atomCount);
            for (var a = 0; a < atomCount; a++) d.Add(new Vec3(v[o + 3 + 3 * a], v[o + 4 + 3 * a], v[o + 5 + 3 * a]));
            modes[m] = new NormalMode(v[o], d.MoveToImmutable(), v[o + 1], v[o + 2] * NewtonPerMetrePerMdynPerAngstrom);
        }
        return modes;
    }

    /// <summary>The molecule a calculation stores, or null when it has no geometry.</summary>
    public static Molecule? ToMolecule(byte[]? atomicNumbers, byte[]? positions, int charge, int multiplicity)
    {
        if (atomicNumbers is null || positions is null || atomicNumbers.Length == 0) return null;
        return new Molecule(ToElements(atomicNumbers), ToPositions(positions), charge, multiplicity);
    }
}
