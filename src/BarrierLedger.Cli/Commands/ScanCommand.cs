using System.CommandLine;
using System.Globalization;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger scan FILE</c>: the points of a relaxed scan (CSV table or a bundle scan), the interpolated maxima and
/// flagged points (jumps, non-converged points, irregular steps), with the scan verdict.
/// </summary>
internal static class ScanCommand
{
    public static Command Create(CliContext ctx)
    {
        var file = new Argument<string>("file") { Description = "CSV scan table, a multi-frame XYZ file with an energy on each frame, or a bundle (.json or .zip) holding scans" };
        CommonOptions.RejectUnknownOptions(file);
        var scanLabel = new Option<string?>("--scan") { Description = "Label of the scan when FILE is a bundle with several" };
        var unit = new Option<string?>("--energy-unit") { Description = "Unit of a CSV table's energies when its header does not say (default hartree)" };
        var atoms = new Option<string?>("--atoms")
        {
            Description = "For a multi-frame XYZ file: the scanned coordinate as 1-based atom numbers, 2 for a distance (Å), 3 for an angle, 4 for a dihedral (°), e.g. 1,6",
        };
        var json = CommonOptions.Json();
        var command = new Command("scan", "Relaxed-scan profile: points, interpolated maxima and flagged points.") { file, scanLabel, unit, atoms, json };
        command.SetAction(pr =>
        {
            EnergyUnit? energyUnit = null;
            if (pr.GetValue(unit) is { } ut)
            {
                if (!Energy.TryParseUnit(ut, out var u)) throw new UsageException($"--energy-unit '{ut}' is not known; expected hartree, kcal/mol, kJ/mol, eV or cm-1");
                energyUnit = u;
            }
            var path = pr.GetValue(file)!;
            var loaded = InputLoader.Load(path, scanUnit: energyUnit);
            ctx.WriteIssues(loaded.Issues);
            if (!loaded.Succeeded) return ExitCodes.Unreadable;
            IReadOnlyList<ScanPoint> points;
            ScanCoordinate? coordinate = null;
            var label = Path.GetFileName(path);
            switch (loaded.Value)
            {
                case ScanTable t:
                    points = t.Points;
                    break;
                case Bundle b:
                    var wanted = pr.GetValue(scanLabel);
                    var scans = wanted is null ? b.Scans.ToList() : b.Scans.Where(s => s.Label == wanted).ToList();
                    if (scans.Count != 1)
                    {
                        ctx.Err.WriteLine(wanted is null
                            ? $"barrierledger: {label} has {b.Scans.Length} scans; name one with --scan ({string.Join(", ", b.Scans.Select(s => s.Label))})"
                            : $"barrierledger: {label} has no scan '{wanted}'");
                        return ExitCodes.Unreadable;
                    }
                    points = scans[0].Points;
                    coordinate = scans[0].Coordinate;
                    label = scans[0].Label;
                    break;
                case XyzDocument d:
                    var atomList = pr.GetValue(atoms) ?? throw new UsageException(
                        $"{label} is an XYZ file: say which coordinate was scanned with --atoms, e.g. --atoms 1,6 for the distance between atoms 1 and 6");
                    coordinate = ParseAtoms(atomList);
                    if (!XyzScan.TryBuild(d, coordinate, label, out var fromFrames, out var problem))
                    {
                        ctx.Err.WriteLine($"barrierledger: {problem}");
                        return ExitCodes.Unreadable;
                    }
                    points = fromFrames;
                    break;
                default:
                    ctx.Err.WriteLine($"barrierledger: {label} is not a scan; expected a CSV scan table, a multi-frame XYZ file or a bundle with scans");
                    return ExitCodes.Unreadable;
            }
            ScanProfile profile;
            try { profile = ScanAnalysis.Analyze(points, coordinate); }
            catch (ArgumentException ex)
            {
                ctx.Err.WriteLine($"barrierledger: {label}: the scan cannot be analysed: {ex.Message}");
                return ExitCodes.Unreadable;
            }
            var check = ScanCheck.Run(profile);
            if (pr.GetValue(json)) ctx.WriteJson(ToJson(label, profile, check));
            else WriteTable(ctx.Out, label, profile);
            return WriteScanVerdict(ctx, profile, check, pr.GetValue(json));
        });
        return command;
    }

    /// <summary>
    /// Prints the scan verdict (<see cref="ScanCheck"/>) with its reasons. Exit 1 when the check fails or a jump is flagged
    /// (a discontinuous profile is not usable as it is), else 0.
    /// </summary>
    private static int WriteScanVerdict(CliContext ctx, ScanProfile profile, ScanCheckResult check, bool json)
    {
        var jumps = profile.Flags.Count(f => f.Code == ScanFlagCodes.Jump);
        if (!json)
        {
            if (jumps > 0) ctx.Out.WriteLine($"{jumps} point(s) flagged as jumps: the profile is not continuous there.");
            VerdictOutput.Write(ctx.Out, "Scan check", check.Verdict, check.Reasons);
        }
        return jumps > 0 ? ExitCodes.ChecksFailed : VerdictOutput.ExitCode(check.Verdict);
    }

    private static double Reference(ScanProfile p) =>
        p.Points.Where(x => x.Converged).Select(x => x.EnergyHartree).DefaultIfEmpty(p.Points[0].EnergyHartree).Min();

    private static object ToJson(string label, ScanProfile p, ScanCheckResult check)
    {
        var e0 = Reference(p);
        return new
        {
            scan_check = VerdictOutput.Json(check.Verdict, check.Reasons),
            scan = label,
            coordinate_kind = p.Coordinate?.Kind.ToString().ToLowerInvariant(),
            coordinate_atoms = p.Coordinate?.Atoms.Select(a => a + 1),
            coordinate_unit = p.Unit,
            reference_energy_hartree = e0,
            points = p.Points.Select((x, i) => new
            {
                index = i + 1,
                coordinate = x.Coordinate,
                energy_hartree = x.EnergyHartree,
                relative_kcal_per_mol = Energy.FromHartree(x.EnergyHartree - e0).KcalPerMol,
                converged = x.Converged,
            }),
            interpolation = p.Interpolation,
            maxima = p.Maxima.Select(m => new
            {
                coordinate = m.Coordinate,
                energy_hartree = m.Energy.Hartree,
                relative_kcal_per_mol = Energy.FromHartree(m.Energy.Hartree - e0).KcalPerMol,
                nearest_point = m.NearestPointIndex + 1,
            }),
            barrier_from_first_kcal_per_mol = p.BarrierFromFirst?.KcalPerMol,
            barrier_from_lowest_before_kcal_per_mol = p.BarrierFromLowestBefore?.KcalPerMol,
            typical_step = p.TypicalStep,
            flags = p.Flags.Select(f => new { code = f.Code, point = f.PointIndex + 1, message = f.Message }),
        };
    }

    private static void WriteTable(TextWriter o, string label, ScanProfile p)
    {
        var e0 = Reference(p);
        var coord = p.Coordinate is { } c ? $"{c.Kind.ToString().ToLowerInvariant()} {string.Join("-", c.Atoms.Select(a => a + 1))}" : "coordinate";
        o.WriteLine($"Scan {label}: {p.Points.Length} points along {coord} ({p.Unit}); interpolation: {p.Interpolation}");
        o.WriteLine();
        o.WriteLine($"  point   {"coord/" + p.Unit,10}   energy/Eh          rel./(kcal/mol)   converged   flags");
        for (var i = 0; i < p.Points.Length; i++)
        {
            var x = p.Points[i];
            var flags = string.Join(", ", p.Flags.Where(f => f.PointIndex == i).Select(f => f.Code));
            o.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"  {i + 1,5}   {x.Coordinate,10:F4}   {x.EnergyHartree,16:F8}   {Energy.FromHartree(x.EnergyHartree - e0).KcalPerMol,15:F3}   {(x.Converged ? "yes" : "NO"),9}   {flags}"));
        }
        o.WriteLine();
        if (p.Maxima.IsEmpty) o.WriteLine("No interior maximum.");
        foreach (var m in p.Maxima)
            o.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"Maximum at {m.Coordinate:F4} {p.Unit}: {m.Energy.Hartree:F8} Eh, {Energy.FromHartree(m.Energy.Hartree - e0).KcalPerMol:F3} kcal/mol above the lowest point (nearest point {m.NearestPointIndex + 1})"));
        // Each flag's message is printed once, as a reason of the scan check that follows the table.
    }

    /// <summary>Parses "1,6" (distance), "1,2,3" (angle) or "1,2,3,4" (dihedral), 1-based, into a 0-based coordinate.</summary>
    internal static ScanCoordinate ParseAtoms(string text)
    {
        var parts = text.Split([',', '-', ' '], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        var kind = parts.Length switch
        {
            2 => ScanCoordinateKind.Distance,
            3 => ScanCoordinateKind.Angle,
            4 => ScanCoordinateKind.Dihedral,
            _ => throw new UsageException($"--atoms '{text}' names {parts.Length} atom(s); expected 2 (distance), 3 (angle) or 4 (dihedral), e.g. 1,6"),
        };
        var list = new List<int>();
        foreach (var part in parts)
        {
            if (!int.TryParse(part, NumberStyles.None, CultureInfo.InvariantCulture, out var n) || n < 1)
                throw new UsageException($"--atoms '{text}': '{part}' is not an atom number; expected 1-based whole numbers such as 1,6");
            if (list.Contains(n - 1)) throw new UsageException($"--atoms '{text}' names atom {n} twice");
            list.Add(n - 1);
        }
        return new ScanCoordinate(kind, list);
    }
}
