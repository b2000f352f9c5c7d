using System.Security.Cryptography;
using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Uploads;
using BenchmarkDotNet.Attributes;
using Microsoft.Data.Sqlite;

namespace BarrierLedger.Benchmarks;

/// <summary>
/// Storing a 1,000-frame × 100-atom relaxed-scan upload (issue 6 goal: ≤ 1 s, and ≤ 3× the raw baseline), side by side with
/// the same rows inserted by raw Microsoft.Data.Sqlite prepared statements in one transaction (file, upload, scan, 1,000 points
/// with their geometry blobs). Each invocation writes into a fresh migrated database file.
/// </summary>
[Config(typeof(LedgerBenchConfig))]
public class LedgerUploadBenchmarks
{
    private const int Frames = 1000;
    private const int Atoms = 100;
    private byte[] _file = [];
    private UploadDraft _draft = null!;
    private LedgerBenchHost? _host;
    private int _n;

    private static UploadChoices Choices(string key) => new()
    {
        NewStudyName = "Benchmark", SpeciesLabel = "chain", Kind = CalculationKind.RelaxedScan, LevelOfTheory = "MODEL-A/basis-1",
        ScanAtoms = [1, 2], Charge = 0, Multiplicity = 1, UploadKey = key,
    };

    [GlobalSetup]
    public void Setup()
    {
        _file = Encoding.UTF8.GetBytes(LedgerBenchHost.ScanXyz(Frames, Atoms));
        _draft = UploadReader.Read([new UploadFile("scan.xyz", _file)], Choices("x"));
        if (_draft.Issues.Any(i => i.IsError)) throw new InvalidOperationException(string.Join("\n", _draft.Issues));
        LedgerBenchHost.PrintLoadAverage("before the runs");
    }

    [GlobalCleanup]
    public void LoadAfter() => LedgerBenchHost.PrintLoadAverage("after the runs");

    [IterationSetup]
    public void FreshDatabase() => _host = new LedgerBenchHost();

    [IterationCleanup]
    public void Cleanup() => _host?.Dispose();

    [Benchmark(Baseline = true, Description = "raw Microsoft.Data.Sqlite prepared inserts, one transaction")]
    public void RawInserts()
    {
        using var c = new SqliteConnection(_host!.Options.SqliteConnectionString);
        c.Open();
        using var tx = c.BeginTransaction();
        long Scalar(string sql, params (string, object)[] ps)
        {
            using var cmd = c.CreateCommand();
            cmd.Transaction = tx;
            cmd.CommandText = sql;
            foreach (var (n, v) in ps) cmd.Parameters.AddWithValue(n, v);
            return (long)cmd.ExecuteScalar()!;
        }
        var sha = Convert.ToHexStringLower(SHA256.HashData(_file));
        var now = DateTimeOffset.UtcNow.ToString("O");
        var study = Scalar("INSERT INTO Studies (Name, Description, CreatedAt, Retired, Version) VALUES ('Benchmark', '', $t, 0, 1) RETURNING Id", ("$t", now));
        var species = Scalar("INSERT INTO Species (StudyId, Label, Charge, Multiplicity, Formula, SymmetryNumber, Retired, Version) VALUES ($s, 'chain', 0, 1, '', 1, 0, 1) RETURNING Id", ("$s", study));
        var file = Scalar("INSERT INTO StoredFiles (Sha256, FileName, SizeBytes, Content, UploadedByUserId, UploadedAt) VALUES ($h, 'scan.xyz', $n, $c, 'u', $t) RETURNING Id",
            ("$h", sha), ("$n", _file.Length), ("$c", _file), ("$t", now));
        var upload = Scalar("INSERT INTO Uploads (Key, StudyId, UploaderUserId, At, Summary) VALUES ($k, $s, 'u', $t, '') RETURNING Id", ("$k", $"raw-{_n++}"), ("$s", study), ("$t", now));
        var scan = Scalar("""
            INSERT INTO Scans (SpeciesId, UploadId, Label, LevelOfTheory, CoordinateKind, CoordinateAtoms, AtomicNumbers, StoredFileId, SourceSha256, UploadedByUserId, UploadedAt, Retired, Version)
            VALUES ($sp, $u, 'scan', 'MODEL-A/basis-1', 'Distance', '1,2', $z, $f, $h, 'u', $t, 0, 1) RETURNING Id
            """, ("$sp", species), ("$u", upload), ("$z", Blobs.FromElements(_draft.Scans[0].Points[0].Geometry!.Elements)), ("$f", file), ("$h", sha), ("$t", now));
        using var ins = c.CreateCommand();
        ins.Transaction = tx;
        ins.CommandText = "INSERT INTO ScanPoints (ScanId, \"Index\", Coordinate, EnergyHartree, Converged, PositionsAngstrom) VALUES ($s, $i, $c, $e, 1, $p)";
        var ps = ins.Parameters.Add("$s", SqliteType.Integer);
        var pi = ins.Parameters.Add("$i", SqliteType.Integer);
        var pc = ins.Parameters.Add("$c", SqliteType.Real);
        var pe = ins.Parameters.Add("$e", SqliteType.Real);
        var pp = ins.Parameters.Add("$p", SqliteType.Blob);
        ins.Prepare();
        ps.Value = scan;
        var points = _draft.Scans[0].Points;
        for (var i = 0; i < points.Count; i++)
        {
            pi.Value = i;
            pc.Value = points[i].Coordinate;
            pe.Value = points[i].EnergyHartree;
            pp.Value = Blobs.FromPositions(points[i].Geometry!.PositionsAngstrom);
            ins.ExecuteNonQuery();
        }
        tx.Commit();
    }

    [Benchmark(Description = "UploadService.StoreDraftAsync (validated, audited, one transaction)")]
    public void LedgerStore()
    {
        var outcome = _host!.Get<UploadService>().StoreDraftAsync(_draft, Choices($"ledger-{_n++}"), "u").GetAwaiter().GetResult();
        if (!outcome.Stored) throw new InvalidOperationException(string.Join("\n", outcome.Errors));
    }

    [Benchmark(Description = "UploadService.StoreAsync from the file bytes (read + store)")]
    public void LedgerReadAndStore()
    {
        var outcome = _host!.Get<UploadService>().StoreAsync([new UploadFile("scan.xyz", _file)], Choices($"file-{_n++}"), "u").GetAwaiter().GetResult();
        if (!outcome.Stored) throw new InvalidOperationException(string.Join("\n", outcome.Errors));
    }
}
