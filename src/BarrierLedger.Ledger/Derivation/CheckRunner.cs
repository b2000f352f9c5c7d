using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Vibrations;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>Evidence stored with a frequency check (JSON): imaginary modes with their character, and the scan comparison.</summary>
public sealed record CheckEvidence(IReadOnlyList<ModeEvidence> ImaginaryModes, ScanEvidence? Scan, double ThresholdCm1)
{
    /// <summary>Which states the IRC connects (issue 20), when the saddle point has an IRC.</summary>
    public ConnectionEvidence? Connection { get; init; }
    /// <summary>Whether the bonds the imaginary mode makes and breaks are those between the neighbouring states.</summary>
    public PredictionEvidence? ModePrediction { get; init; }
}

/// <summary>One imaginary mode: wavenumber (negative), significant or soft, class, summary and its leading motions.</summary>
public sealed record ModeEvidence(int ModeIndex, double FrequencyCm1, bool Significant, string Class, bool RotorLike, string Summary, IReadOnlyList<ComponentEvidence> Leading);

public sealed record ComponentEvidence(string Label, double Share, bool IsReactionBond);

public sealed record ScanEvidence(int ScanId, double SaddleCoordinate, double ScanMaximumCoordinate, double DistanceInSteps, string Unit);

/// <summary>Runs the Core saddle-point check on a stored calculation and turns the result into a <see cref="FrequencyCheck"/>'s fields.</summary>
internal static class CheckRunner
{
    public const string NoModesCode = "saddle.no-modes";
    public const string NoGeometryCode = "saddle.no-geometry";

    public sealed record Input(int CalculationId, Molecule? Geometry, NormalMode[] Modes, double[] Frequencies, (int A, int B)[] PairsOneBased,
        int? ScanId, IReadOnlyList<ScanPoint>? ScanPoints, ScanCoordinate? ScanCoordinate)
    {
        /// <summary>The neighbouring states and the IRC, for the connection check and the mode's bond-change prediction.</summary>
        public ConnectionInputs? Connection { get; init; }
    }

    /// <summary>What a check depends on: the calculation, the thresholds, the declared pairs and the scan (id and size).</summary>
    public static string Fingerprint(int calculationId, (int A, int B)[] pairsOneBased, int? scanId, int? scanPointCount, ModelSettings model, string connection = "") =>
        ModelSettings.Hash(string.Join("|", "k2", calculationId, model.CheckFingerprint,
            string.Join(",", pairsOneBased.Select(p => $"{p.A}-{p.B}")), scanId, scanPointCount, connection));

    public static (Verdict Verdict, string ReasonsJson, string EvidenceJson) Run(Input i, ModelSettings model)
    {
        var threshold = model.SignificantImaginaryCm1;
        if (i.Geometry is null)
            return Fail(NoGeometryCode, "The saddle-point calculation has no geometry stored, so it cannot be checked.", threshold);
        if (i.Modes.Length == 0)
        {
            var imaginary = i.Frequencies.Where(f => f < 0).ToList();
            var significant = imaginary.Count(f => Math.Abs(f) >= threshold);
            var text = i.Frequencies.Length == 0
                ? "No frequencies or normal modes are stored, so nothing shows that this is a saddle point. Upload the frequency calculation (modes or Hessian)."
                : $"Only frequencies are stored ({significant} significant imaginary of {imaginary.Count} imaginary), no normal modes: what the imaginary mode does cannot be checked. Upload the modes or the Hessian.";
            var verdict = significant == 1 ? Verdict.NeedsAttention : Verdict.Failed;
            var reasons = new[] { new CheckReason(NoModesCode, verdict == Verdict.Failed ? CheckSeverity.Failure : CheckSeverity.Attention, text) };
            var evidence = new CheckEvidence([.. imaginary.Select((f, k) => new ModeEvidence(k, f, Math.Abs(f) >= threshold, "unknown", false, "no normal mode stored", []))], null, threshold);
            return (verdict, DerivedJson.Write(reasons), DerivedJson.Write(evidence));
        }
        ScanProfile? profile = null;
        if (i.ScanPoints is { Count: >= 2 } points)
            profile = ScanAnalysis.Analyze(points, i.ScanCoordinate, new ScanOptions(JumpThresholdKcalPerMol: model.ScanJumpKcalPerMol));
        var input = new SaddleCheckInput(i.Geometry, i.Modes, [.. i.PairsOneBased.Select(p => (p.A - 1, p.B - 1))], profile);
        var result = SaddleCheck.Run(input, new SaddleCheckOptions(SignificantImaginaryCm1: threshold));
        var modeIndex = i.Modes.Select((m, k) => (m, k)).ToDictionary(x => x.m, x => x.k);
        ModeEvidence Evidence(SoftMode s, bool significant) => new(modeIndex.GetValueOrDefault(s.Mode, -1), s.Mode.FrequencyCm1, significant,
            s.Character.Class.ToString(), s.Character.RotorLike, s.Character.Summary,
            [.. s.Character.Leading(3).Select(c => new ComponentEvidence(c.Label, c.Share, c.IsReactionBond))]);
        var all = result.Reasons.ToList();
        ConnectionEvidence? connection = null;
        PredictionEvidence? prediction = null;
        if (i.Connection is { } ci)
        {
            // Issue 20: where the IRC leads joins the evidence and the verdict; without one, the mode's bond-change prediction does.
            if (ci.CheckInput(i.Geometry) is { } check)
            {
                var c = ConnectionCheck.Run(check);
                all.AddRange(c.Reasons);
                connection = new ConnectionEvidence(ci.Irc!.Id, ci.Irc.Form == Core.Formats.IrcForm.Path ? "path" : "endpoint pair", c.Connection.ToString(), c.Headline,
                    [.. c.Ends.Select(e => new EndEvidence(e.Name, e.Reached?.State, e.ReachedIsNeighbour, e.Reached is { } r && double.IsFinite(r.RmsdAngstrom) ? r.RmsdAngstrom : null,
                        e.Reached?.Explanation ?? (e.Comparisons.Length > 0 ? e.Comparisons[0].Explanation : "not compared")))],
                    c.SaddleFrameRmsdAngstrom);
            }
            if (result.SignificantMode is { } mode && !mode.DisplacementCartesian.IsDefaultOrEmpty)
            {
                var p = ModeBondPrediction.Run(i.Geometry, mode, ci.Before, ci.After);
                // With an IRC the IRC decides; the prediction is then reported, not weighed.
                all.AddRange(connection is null ? p.Reasons : p.Reasons.Select(r => r with { Severity = CheckSeverity.Info }));
                prediction = new PredictionEvidence(p.Outcome.ToString(), p.AmplitudeAngstrom, p.Reasons[0].Message);
            }
        }
        var ordered = all.OrderByDescending(r => r.Severity).ToList();
        var ev = new CheckEvidence(
            [.. result.SignificantModes.Select(s => Evidence(s, true)), .. result.SoftModes.Select(s => Evidence(s, false))],
            result.Scan is { } sc && i.ScanId is { } sid ? new ScanEvidence(sid, sc.SaddleCoordinate, sc.ScanMaximumCoordinate, sc.DistanceInSteps, sc.Unit) : null,
            threshold) { Connection = connection, ModePrediction = prediction };
        return (CheckReason.VerdictOf(ordered), DerivedJson.Write(ordered),
            DerivedJson.Write(ev));
    }

    private static (Verdict, string, string) Fail(string code, string message, double threshold) =>
        (Verdict.Failed, DerivedJson.Write(new[] { new CheckReason(code, CheckSeverity.Failure, message) }), DerivedJson.Write(new CheckEvidence([], null, threshold)));

    /// <summary>Rebuilds the check input from a stored calculation, the state's pairs and an optional scan.</summary>
    public static Input FromStored(Calculation c, Species sp, (int A, int B)[] pairs, Scan? scan, IReadOnlyList<ScanPointRecord>? points)
    {
        var mol = Blobs.ToMolecule(c.AtomicNumbers, c.PositionsAngstrom, sp.Charge, sp.Multiplicity);
        ScanCoordinate? coordinate = null;
        List<ScanPoint>? scanPoints = null;
        if (scan is not null && points is not null)
        {
            var atoms = scan.CoordinateAtoms.Split(',', StringSplitOptions.RemoveEmptyEntries).Select(a => int.Parse(a, System.Globalization.CultureInfo.InvariantCulture) - 1).ToArray();
            coordinate = new ScanCoordinate(scan.CoordinateKind, atoms);
            scanPoints = [.. points.OrderBy(p => p.Index).Select(p => new ScanPoint(p.Coordinate, p.EnergyHartree, p.Converged))];
        }
        return new Input(c.Id, mol, mol is null ? [] : Blobs.ToModes(c.Modes, c.AtomCount), Blobs.ToDoubles(c.FrequenciesCm1), pairs,
            scan?.Id, scanPoints, coordinate);
    }
}
