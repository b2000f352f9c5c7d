using System.Collections.Immutable;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// Reads XYZ and extended XYZ, single or multi-frame (rules in docs/formats.md):
/// <list type="bullet">
/// <item>each frame: a line with the atom count, a comment line, then one line per atom: element symbol or atomic number and x y z in Å, separated by any whitespace;</item>
/// <item>the comment line gives the energy in hartree when it is a bare number ("-76.4189") or carries <c>energy=</c>
/// (optionally with <c>energy_unit=</c> naming another unit);</item>
/// <item>extended XYZ: <c>key=value</c> comment (quoted values allowed), <c>Properties=species:S:1:pos:R:3[:name:T:n...]</c> naming the columns,
/// <c>charge=</c> and <c>multiplicity=</c> keys; <c>Lattice</c> and <c>pbc</c> are ignored with a warning.</item>
/// </list>
/// </summary>
public static class XyzReader
{
    public static ReadResult<XyzDocument> Read(Stream stream, string fileName, ReaderLimits? limits = null) =>
        Read(stream, fileName, limits, warnUnstatedOddElectrons: true);

    /// <summary>
    /// As <see cref="Read(Stream, string, ReaderLimits?)"/>; a caller that supplies charge and multiplicity itself
    /// (the bundle's species) turns off the warning for an odd electron count without charge=/multiplicity= keys.
    /// </summary>
    public static ReadResult<XyzDocument> Read(Stream stream, string fileName, ReaderLimits? limits, bool warnUnstatedOddElectrons)
    {
        limits ??= ReaderLimits.Default;
        var issues = new IssueCollector(fileName, limits.MaxIssues);
        var bytes = TextInput.ReadBytes(stream, limits.MaxBytes, issues);
        if (bytes is null || !TextInput.CheckText(bytes, issues, out var start)) return issues.Result<XyzDocument>(null);
        return Parse(new TextLines(bytes, start), issues, limits, warnUnstatedOddElectrons);
    }

    /// <summary>Reads from text already in memory (the same rules as <see cref="Read(Stream, string, ReaderLimits?)"/>).</summary>
    public static ReadResult<XyzDocument> ReadText(string text, string fileName, ReaderLimits? limits = null)
    {
        limits ??= ReaderLimits.Default;
        var issues = new IssueCollector(fileName, limits.MaxIssues);
        if (text.Length > limits.MaxBytes)
        {
            issues.Error(null, $"file is larger than the limit of {TextInput.FormatBytes(limits.MaxBytes)}");
            return issues.Result<XyzDocument>(null);
        }
        return Parse(new TextLines(text), issues, limits, true);
    }

    private sealed record Column(string Name, char Type, int Count, int Offset);

    /// <summary>
    /// One pass over the lines, a frame at a time: only the current line is decoded, so memory holds the file's bytes and the
    /// frames read, never the whole text or all its lines.
    /// </summary>
    private static ReadResult<XyzDocument> Parse(TextLines lines, IssueCollector issues, ReaderLimits limits, bool warnUnstatedOddElectrons)
    {
        var frames = new List<XyzFrame>();
        var extended = false;
        var warnedExtraColumns = false;
        var warnedLattice = false;
        var fields = new List<Range>();
        var elementsSeen = new Dictionary<string, Element>(StringComparer.Ordinal);
        int? previousCount = null;
        Span<double> xyz = stackalloc double[3];
        while (true)
        {
            ReadOnlySpan<char> line;
            do
            {
                if (!lines.TryTake(out line)) goto done;
            } while (line.IsWhiteSpace());
            var countLine = lines.Number;
            var countSpan = line.Trim();
            if (!Numbers.TryParseInt(countSpan, out var count) || count < 0)
            {
                var countText = countSpan.ToString();
                var hint = previousCount is { } pc
                    ? $" (the frame before declared {pc} atoms; is that count too small, or is this a stray line?)"
                    : "";
                issues.Error(countLine, $"expected the number of atoms (a whole number) to start a frame, found {TextInput.Quote(countText)}{hint}");
                break;
            }
            if (count == 0) { issues.Error(countLine, "atom count is 0, expected at least one atom"); break; }
            if (count > limits.MaxAtoms)
            {
                issues.Error(countLine, $"atom count {count} is above the limit of {limits.MaxAtoms} atoms (ReaderLimits.MaxAtoms)");
                break;
            }
            if (frames.Count >= limits.MaxFrames)
            {
                issues.Error(countLine, $"more than {limits.MaxFrames} frames (ReaderLimits.MaxFrames)");
                break;
            }
            if (!lines.TryTake(out line))
            {
                issues.Error(countLine + 1, $"file ends after the atom count; expected a comment line and {count} atom lines");
                break;
            }
            var comment = line.ToString();
            var commentLine = countLine + 1;
            var frameOk = true;

            // Comment line.
            double? energy = null;
            int charge = 0, multiplicity = 1;
            var keys = ImmutableDictionary.Create<string, string>(StringComparer.OrdinalIgnoreCase);
            Column[]? columns = null;
            var trimmed = comment.Trim();
            if (trimmed.Length > 0 && Numbers.TryParseDouble(trimmed, out var bare))
            {
                energy = bare;
            }
            else if (comment.Contains('='))
            {
                if (!KeyValueLine.TryParse(comment, out var pairs, out var kvError))
                {
                    if (comment.Contains("Properties=", StringComparison.OrdinalIgnoreCase))
                    {
                        issues.Error(commentLine, $"cannot read the extended XYZ comment line: {kvError}");
                        frameOk = false;
                    }
                    else if (comment.Contains("energy", StringComparison.OrdinalIgnoreCase))
                        issues.Warning(commentLine, $"the comment mentions an energy but is not key=value text ({kvError}); no energy taken. Accepted forms: a bare number, or energy=VALUE");
                }
                else
                {
                    extended = true;
                    var builder = keys.ToBuilder();
                    foreach (var (k, v) in pairs)
                    {
                        if (builder.ContainsKey(k)) issues.Warning(commentLine, $"key '{k}' appears more than once; the last value is used");
                        builder[k] = v;
                    }
                    keys = builder.ToImmutable();
                    frameOk &= ReadKeys(keys, commentLine, issues, ref energy, ref charge, ref multiplicity, out columns, ref warnedLattice);
                }
            }
            else if (comment.Contains("energy", StringComparison.OrdinalIgnoreCase))
            {
                issues.Warning(commentLine, "the comment mentions an energy but in no accepted form; no energy taken. Accepted forms: a bare number, or energy=VALUE");
            }
            if (energy is { } e0 && !double.IsFinite(e0))
            {
                issues.Error(commentLine, $"energy is {Numbers.Format(e0)}, expected a finite number");
                frameOk = false;
            }

            // Atom lines.
            var elements = new Element[count];
            var positions = new Vec3[count];
            var expectedColumns = columns?.Sum(c => c.Count);
            var speciesColumn = columns?.FirstOrDefault(c => c.Name.Equals("species", StringComparison.OrdinalIgnoreCase))
                                ?? columns?.FirstOrDefault(c => c.Name.Equals("Z", StringComparison.OrdinalIgnoreCase));
            var posColumn = columns?.First(c => c.Name.Equals("pos", StringComparison.OrdinalIgnoreCase));
            var atomsRead = 0;
            var endedEarly = false;
            for (var a = 0; a < count; a++)
            {
                if (!lines.HasMore || lines.NextIsLastAndBlank())
                {
                    issues.Error(countLine, $"frame {frames.Count + 1} declares {count} atoms but the file ends after {a} atom line(s)");
                    frameOk = false;
                    endedEarly = true;
                    break;
                }
                lines.TryTake(out line);
                var lineNo = lines.Number;
                Split(line, fields);
                if (fields.Count == 0)
                {
                    issues.Error(lineNo, $"blank line inside frame {frames.Count + 1}, expected atom {a + 1} of {count}: an element and 3 coordinates");
                    frameOk = false;
                    continue;
                }
                int elementField = 0, xField = 1;
                if (columns is not null)
                {
                    if (fields.Count != expectedColumns)
                    {
                        issues.Error(lineNo, $"expected {expectedColumns} columns as declared by Properties, found {fields.Count}");
                        frameOk = false;
                        continue;
                    }
                    elementField = speciesColumn!.Offset;
                    xField = posColumn!.Offset;
                }
                else if (fields.Count < 4)
                {
                    issues.Error(lineNo, $"expected an element and 3 coordinates (x y z in Å), found {fields.Count} field(s): {TextInput.Quote(line.Trim().ToString())}");
                    frameOk = false;
                    continue;
                }
                else if (fields.Count > 4 && !warnedExtraColumns)
                {
                    warnedExtraColumns = true;
                    issues.Warning(lineNo, $"{fields.Count - 4} column(s) after x y z are ignored (declare them with Properties= to name them)");
                }
                if (!TryElement(line[fields[elementField]], elementsSeen, out var element, out var elError))
                {
                    issues.Error(lineNo, elError);
                    frameOk = false;
                }
                var coordOk = true;
                for (var c = 0; c < 3; c++)
                {
                    var f = line[fields[xField + c]];
                    if (!Numbers.TryParseDouble(f, out xyz[c]))
                    {
                        issues.Error(lineNo, $"coordinate {"xyz"[c]} of atom {a + 1} is {TextInput.Quote(f.ToString())}, expected a number");
                        coordOk = false;
                    }
                    else if (!double.IsFinite(xyz[c]))
                    {
                        issues.Error(lineNo, $"coordinate {"xyz"[c]} of atom {a + 1} is {f.ToString()}, expected a finite number");
                        coordOk = false;
                    }
                    else if (StructureChecks.ImplausibleCoordinate(xyz[c]) is { } far)
                    {
                        issues.Error(lineNo, $"coordinate {"xyz"[c]} of atom {a + 1}: {far}");
                        coordOk = false;
                    }
                }
                frameOk &= coordOk;
                if (element is not null) elements[a] = element;
                positions[a] = new Vec3(xyz[0], xyz[1], xyz[2]);
                atomsRead++;
            }
            if (!frameOk || issues.HasErrors)
            {
                // Later frames are read on so every error in the file is listed, as long as the layout is intact.
                if (endedEarly) break;
                previousCount = count;
                continue;
            }
            var molecule = new Molecule(elements, positions, charge, multiplicity);
            foreach (var m in StructureChecks.DuplicateAtomMessages(molecule)) issues.Error(countLine, $"frame {frames.Count + 1}: {m}");
            if (energy is { } eh && StructureChecks.ImplausibleEnergy(eh, molecule) is { } why)
                issues.Error(commentLine, why);
            if (molecule.ElectronCount % 2 == multiplicity % 2)
            {
                if (keys.ContainsKey("charge") || keys.ContainsKey("multiplicity"))
                    issues.Error(commentLine, $"{molecule.ElectronCount} electrons cannot have spin multiplicity {multiplicity} " +
                                              "(an even electron count needs an odd multiplicity and vice versa); check charge= and multiplicity=");
                else if (warnUnstatedOddElectrons)
                    issues.Warning(commentLine, $"{molecule.ElectronCount} electrons (odd) but no charge= or multiplicity= given; " +
                                                "read as neutral singlet, which is impossible: state them in the comment or in the bundle species");
            }
            frames.Add(new XyzFrame(molecule, energy, comment, keys, countLine));
            previousCount = count;
        }
        done:
        if (frames.Count == 0 && !issues.HasErrors) issues.Error(1, "no structure found: the file is empty; expected an atom count on the first line");
        return issues.Result(new XyzDocument([.. frames], extended));
    }

    /// <summary>The white-space separated fields of <paramref name="line"/> (as <c>string.Split(null, RemoveEmptyEntries)</c> finds them).</summary>
    private static void Split(ReadOnlySpan<char> line, List<Range> fields)
    {
        fields.Clear();
        var i = 0;
        while (true)
        {
            while (i < line.Length && char.IsWhiteSpace(line[i])) i++;
            if (i == line.Length) return;
            var start = i;
            while (i < line.Length && !char.IsWhiteSpace(line[i])) i++;
            fields.Add(start..i);
        }
    }

    /// <summary><see cref="Numbers.TryParseElement"/>, remembering each token already read (a file names the same few elements on every line).</summary>
    private static bool TryElement(ReadOnlySpan<char> token, Dictionary<string, Element> seen, out Element element, out string error)
    {
        error = "";
        if (seen.GetAlternateLookup<ReadOnlySpan<char>>().TryGetValue(token, out element!)) return true;
        var text = token.ToString();
        if (!Numbers.TryParseElement(text, out element, out error)) return false;
        seen[text] = element;
        return true;
    }

    private static bool ReadKeys(ImmutableDictionary<string, string> keys, int line, IssueCollector issues,
        ref double? energy, ref int charge, ref int multiplicity, out Column[]? columns, ref bool warnedLattice)
    {
        var ok = true;
        columns = null;
        var unit = EnergyUnit.Hartree;
        if (keys.TryGetValue("energy_unit", out var unitText) && !Energy.TryParseUnit(unitText, out unit))
        {
            issues.Error(line, $"energy_unit '{unitText}' is not a unit we know; expected hartree, kcal/mol, kJ/mol, eV or cm-1");
            ok = false;
        }
        if (keys.TryGetValue("energy", out var eText))
        {
            if (Numbers.TryParseDouble(eText, out var ev)) energy = Energy.From(ev, unit).Hartree;
            else { issues.Error(line, $"energy={TextInput.Quote(eText)} is not a number"); ok = false; }
        }
        if (keys.TryGetValue("charge", out var cText))
        {
            if (!Numbers.TryParseInt(cText, out charge)) { issues.Error(line, $"charge={TextInput.Quote(cText)} is not a whole number"); ok = false; }
        }
        if (keys.TryGetValue("multiplicity", out var mText))
        {
            if (!Numbers.TryParseInt(mText, out multiplicity) || multiplicity < 1)
            {
                issues.Error(line, $"multiplicity={TextInput.Quote(mText)} is not a whole number of 1 or more (2S+1)");
                multiplicity = 1;
                ok = false;
            }
        }
        foreach (var ignored in new[] { "Lattice", "pbc" })
        {
            if (keys.ContainsKey(ignored) && !warnedLattice)
            {
                warnedLattice = true;
                issues.Warning(line, $"{ignored} is ignored: every structure is treated as an isolated molecule");
            }
        }
        if (keys.TryGetValue("Properties", out var props))
        {
            var parts = props.Split(':');
            if (parts.Length % 3 != 0)
            {
                issues.Error(line, $"Properties={TextInput.Quote(props, 80)} is not a list of name:type:count triplets");
                return false;
            }
            var list = new List<Column>();
            var offset = 0;
            for (var p = 0; p < parts.Length; p += 3)
            {
                var name = parts[p];
                var type = parts[p + 1];
                if (name.Length == 0 || type.Length != 1 || "SRIL".IndexOf(char.ToUpperInvariant(type[0])) < 0
                    || !Numbers.TryParseInt(parts[p + 2], out var n) || n < 1 || n > 1000)
                {
                    issues.Error(line, $"Properties entry {TextInput.Quote($"{parts[p]}:{parts[p + 1]}:{parts[p + 2]}")} is not name:type:count " +
                                       "with type S, R, I or L and a count of 1 or more");
                    return false;
                }
                list.Add(new Column(name, char.ToUpperInvariant(type[0]), n, offset));
                offset += n;
            }
            var species = list.FirstOrDefault(c => c.Name.Equals("species", StringComparison.OrdinalIgnoreCase))
                          ?? list.FirstOrDefault(c => c.Name.Equals("Z", StringComparison.OrdinalIgnoreCase));
            var pos = list.FirstOrDefault(c => c.Name.Equals("pos", StringComparison.OrdinalIgnoreCase));
            if (species is null || species.Count != 1 || pos is null || pos.Count != 3 || pos.Type != 'R')
            {
                issues.Error(line, $"Properties={TextInput.Quote(props, 80)} must name an element column (species:S:1 or Z:I:1) and positions (pos:R:3)");
                return false;
            }
            columns = [.. list];
        }
        return ok;
    }
}
