using System.Security.Cryptography;
using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Uploads;
using BenchmarkDotNet.Attributes;
using System.Data;
using System.Data.Common;
using System.Globalization;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Benchmarks;

/// <summary>
/// Storing a 1,000-frame × 100-atom relaxed-scan upload (issue 6 goal: ≤ 1 s, and ≤ 3× the raw baseline), side by side with
/// the same rows inserted by raw prepared statements in one transaction (file, upload, scan, 1,000 points with their geometry
/// blobs) through the engine's own ADO.NET provider. Each invocation writes into a fresh migrated database, on SQLite and on
/// PostgreSQL (a throwaway local cluster, fsync off) in one run.
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

    [Params(StoreProvider.Sqlite, StoreProvider.PostgreSQL)]
    public StoreProvider Store { get; set; }

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
    public void FreshDatabase() => _host = new LedgerBenchHost(Store);

    [IterationCleanup]
    public void Cleanup() => _host?.Dispose();

    [Benchmark(Baseline = true, Description = "raw ADO.NET prepared inserts (Microsoft.Data.Sqlite / Npgsql), one transaction")]
    public void RawInserts()
    {
        using var db = _host!.Get<IDbContextFactory<LedgerDbContext>>().CreateDbContext();
        var c = db.Database.GetDbConnection();
        c.Open();
        using var tx = c.BeginTransaction();
        DbCommand Command(string sql, params (string Name, DbType Type, object Value)[] ps)
        {
            var cmd = c.CreateCommand();
            cmd.Transaction = tx;
            cmd.CommandText = sql;
            foreach (var (n, t, v) in ps)
            {
                var p = cmd.CreateParameter();
                p.ParameterName = n;
                p.DbType = t;
                p.Value = v;
                cmd.Parameters.Add(p);
            }
            return cmd;
        }
        long Scalar(string sql, params (string, DbType, object)[] ps)
        {
            using var cmd = Command(sql, ps);
            return Convert.ToInt64(cmd.ExecuteScalar()!, CultureInfo.InvariantCulture);
        }
        var sha = Convert.ToHexStringLower(SHA256.HashData(_file));
        var t = ("@t", DbType.DateTimeOffset, (object)DateTimeOffset.UtcNow);
        var no = ("@no", DbType.Boolean, (object)false);
        var study = Scalar("""INSERT INTO "Studies" ("Name", "Description", "CreatedAt", "Retired", "Version") VALUES ('Benchmark', '', @t, @no, 1) RETURNING "Id" """, t, no);
        var species = Scalar("""INSERT INTO "Species" ("StudyId", "Label", "Charge", "Multiplicity", "Formula", "SymmetryNumber", "Retired", "Version") VALUES (@s, 'chain', 0, 1, '', 1, @no, 1) RETURNING "Id" """,
            ("@s", DbType.Int32, (int)study), no);
        var file = Scalar("""INSERT INTO "StoredFiles" ("Sha256", "FileName", "SizeBytes", "Content", "UploadedByUserId", "UploadedAt") VALUES (@h, 'scan.xyz', @n, @c, 'u', @t) RETURNING "Id" """,
            ("@h", DbType.String, sha), ("@n", DbType.Int64, (long)_file.Length), ("@c", DbType.Binary, _file), t);
        var upload = Scalar("""INSERT INTO "Uploads" ("Key", "StudyId", "UploaderUserId", "At", "Summary") VALUES (@k, @s, 'u', @t, '') RETURNING "Id" """,
            ("@k", DbType.String, $"raw-{_n++}"), ("@s", DbType.Int32, (int)study), t);
        var scan = Scalar("""
            INSERT INTO "Scans" ("SpeciesId", "UploadId", "Label", "LevelOfTheory", "CoordinateKind", "CoordinateAtoms", "AtomicNumbers", "StoredFileId", "SourceSha256", "UploadedByUserId", "UploadedAt", "Retired", "Version")
            VALUES (@sp, @u, 'scan', 'MODEL-A/basis-1', 'Distance', '1,2', @z, @f, @h, 'u', @t, @no, 1) RETURNING "Id"
            """, ("@sp", DbType.Int32, (int)species), ("@u", DbType.Int32, (int)upload), ("@z", DbType.Binary, Blobs.FromElements(_draft.Scans[0].Points[0].Geometry!.Elements)),
            ("@f", DbType.Int32, (int)file), ("@h", DbType.String, sha), t, no);
        var points = _draft.Scans[0].Points;
        using var ins = Command("""INSERT INTO "ScanPoints" ("ScanId", "Index", "Coordinate", "EnergyHartree", "Converged", "PositionsAngstrom") VALUES (@s, @i, @c, @e, @yes, @p)""",
            ("@s", DbType.Int32, (int)scan), ("@i", DbType.Int32, 0), ("@c", DbType.Double, 0.0), ("@e", DbType.Double, 0.0), ("@yes", DbType.Boolean, true), ("@p", DbType.Binary, Array.Empty<byte>()));
        DbParameter pi = ins.Parameters[1], pc = ins.Parameters[2], pe = ins.Parameters[3], pp = ins.Parameters[5];
        for (var i = 0; i < points.Count; i++)
        {
            pi.Value = i;
            pc.Value = points[i].Coordinate;
            pe.Value = points[i].EnergyHartree;
            pp.Value = Blobs.FromPositions(points[i].Geometry!.PositionsAngstrom);
            if (i == 0) ins.Prepare();
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
