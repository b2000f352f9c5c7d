using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// One structure of an XYZ or extended XYZ file.
/// </summary>
/// <param name="Molecule">Elements and positions in Å; charge and multiplicity from the comment keys (0 and 1 when absent).</param>
/// <param name="EnergyHartree">Energy from the comment line, converted to hartree; null when the comment carries none.</param>
/// <param name="Comment">The comment line as written.</param>
/// <param name="Keys">The comment's key=value pairs (extended XYZ), case-insensitive keys; empty for a free-text comment.</param>
/// <param name="FirstLine">1-based line of the frame's atom-count line.</param>
public sealed record XyzFrame(
    Molecule Molecule,
    double? EnergyHartree,
    string Comment,
    ImmutableDictionary<string, string> Keys,
    int FirstLine);

/// <summary>The frames of an XYZ file, in file order. <see cref="Extended"/> is true when any comment line had key=value pairs.</summary>
public sealed record XyzDocument(ImmutableArray<XyzFrame> Frames, bool Extended)
{
    /// <summary>The last frame: for an optimisation trajectory, the final structure.</summary>
    public XyzFrame Last => Frames[^1];
}
