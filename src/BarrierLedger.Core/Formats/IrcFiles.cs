using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Formats;

/// <summary>How an IRC result is given.</summary>
public enum IrcForm
{
    /// <summary>The path as frames in order (one end, …, saddle point, …, other end), each with its energy.</summary>
    Path,
    /// <summary>Only the two ends: the structures reached forward and backward from the saddle point.</summary>
    Endpoints,
}

/// <summary>One structure of an IRC result and its electronic energy (hartree) when the file gives one.</summary>
public sealed record IrcStructure(Molecule Geometry, double? EnergyHartree, int? Line = null);

/// <summary>
/// The structures of an IRC result as read: for <see cref="IrcForm.Path"/> every frame in path order, each with an energy;
/// for <see cref="IrcForm.Endpoints"/> exactly two structures, the forward end first, then the backward end.
/// </summary>
public sealed record IrcStructures(IrcForm Form, ImmutableArray<IrcStructure> Structures)
{
    public Molecule First => Structures[0].Geometry;
}

/// <summary>
/// Reads IRC results from XYZ / extended XYZ (rules in docs/formats.md, "IRC paths and endpoints"): a path is one multi-frame file
/// whose every frame carries its energy on the comment line; an endpoint pair is two files, each giving its last frame (the end of
/// an optimisation). Every structure must list the same atoms in the same order; errors name the file and the frame's line.
/// </summary>
public static class IrcFiles
{
    /// <summary>A path from a multi-frame XYZ already read: at least 2 frames, each with an energy, all the same atoms in order.</summary>
    public static ReadResult<IrcStructures> Path(XyzDocument doc, string fileName)
    {
        ArgumentNullException.ThrowIfNull(doc);
        var issues = new List<ReadIssue>();
        void Error(int? line, string message) => issues.Add(new ReadIssue(IssueSeverity.Error, fileName, line, null, message));
        if (doc.Frames.Length < 2)
            Error(doc.Frames.FirstOrDefault()?.FirstLine, $"an IRC path needs at least 2 frames (one end to the other through the saddle point); this file has {doc.Frames.Length}");
        var first = doc.Frames[0].Molecule;
        var structures = ImmutableArray.CreateBuilder<IrcStructure>(doc.Frames.Length);
        var k = 0;
        foreach (var f in doc.Frames)
        {
            k++;
            if (f.EnergyHartree is null)
                Error(f.FirstLine, $"frame {k} of the IRC path has no energy on its comment line (a bare number or energy=...); every frame of a path needs one for the profile");
            if (Differs(first, f.Molecule) is { } why)
                Error(f.FirstLine, $"frame {k} {why} as in frame 1; every frame of a path is the same molecule with its atoms in the same order");
            structures.Add(new IrcStructure(f.Molecule, f.EnergyHartree, f.FirstLine));
            if (issues.Count > 20) break;
        }
        return new ReadResult<IrcStructures>(new IrcStructures(IrcForm.Path, structures.ToImmutable()), issues);
    }

    /// <summary>An endpoint pair: the last frame of each file (energy when given), forward first. The two must list the same atoms in order.</summary>
    public static ReadResult<IrcStructures> Endpoints(XyzDocument forward, string forwardName, XyzDocument backward, string backwardName)
    {
        ArgumentNullException.ThrowIfNull(forward);
        ArgumentNullException.ThrowIfNull(backward);
        var issues = new List<ReadIssue>();
        var f = forward.Last;
        var b = backward.Last;
        if (Differs(f.Molecule, b.Molecule) is { } why)
            issues.Add(new ReadIssue(IssueSeverity.Error, backwardName, b.FirstLine, null,
                $"the backward end {why} as in the forward end ({forwardName}); both ends of an IRC list the saddle point's atoms in its order"));
        return new ReadResult<IrcStructures>(new IrcStructures(IrcForm.Endpoints,
            [new IrcStructure(f.Molecule, f.EnergyHartree, f.FirstLine), new IrcStructure(b.Molecule, b.EnergyHartree, b.FirstLine)]), issues);
    }

    /// <summary>
    /// Null when <paramref name="other"/> lists the same elements as <paramref name="reference"/> in the same order; otherwise what
    /// differs, to be followed by "as in …" ("has 7 atoms, not 6", "has Cl as atom 4, not C").
    /// </summary>
    public static string? Differs(Molecule reference, Molecule other)
    {
        ArgumentNullException.ThrowIfNull(reference);
        ArgumentNullException.ThrowIfNull(other);
        if (other.AtomCount != reference.AtomCount) return $"has {other.AtomCount} atoms, not {reference.AtomCount}";
        for (var a = 0; a < reference.AtomCount; a++)
            if (other.Elements[a].AtomicNumber != reference.Elements[a].AtomicNumber)
                return $"has {other.Elements[a].Symbol} as atom {a + 1}, not {reference.Elements[a].Symbol}";
        return null;
    }
}
