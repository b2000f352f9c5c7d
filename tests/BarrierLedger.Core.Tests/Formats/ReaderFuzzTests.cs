using System.Diagnostics;
using System.Globalization;
using System.IO.Compression;
using System.Text;
using System.Text.Json.Nodes;
using BarrierLedger.Core.Formats;
using Xunit.Abstractions;

namespace BarrierLedger.Core.Tests.Formats;

/// <summary>
/// Fuzz run: for each reader, 10,000 inputs (half random, half mutations of valid files) must each give a value or
/// errors, never an exception, each within a time box. Figures (inputs, time, share read successfully) are printed
/// to the test output. The random generator starts from a fixed number so a failure can be replayed.
/// </summary>
public class ReaderFuzzTests(ITestOutputHelper output)
{
    private const int InputsPerReader = 10_000;
    private static readonly TimeSpan s_perInput = TimeSpan.FromSeconds(5);

    // Small limits keep each input fast and also exercise the limit paths.
    private static readonly ReaderLimits s_limits = new(MaxBytes: 64 * 1024, MaxAtoms: 500, MaxFrames: 500, MaxZipEntries: 50, MaxIssues: 50);

    private static readonly string[] s_xyzCorpus =
    [
        "3\n-76.4\nO 0 0 0\nH 0.757 0 0.586\nH -0.757 0 0.586\n",
        "2\nProperties=species:S:1:pos:R:3:forces:R:3 energy=-1.17 charge=0 multiplicity=1 Lattice=\"1 0 0 0 1 0 0 0 1\"\nH 0 0 0 0 0 0\nH 0 0 0.74 0 0 0\n",
        "1\nenergy=-0.5 energy_unit=hartree charge=0 multiplicity=2\n1 0.0 0.0 0.0\n1\n-0.49D0\nH 0 0 0.1\n",
    ];

    private static readonly string[] s_csvCorpus =
    [
        "r (Å),energy (kcal/mol),converged\n1.5,0.0,yes\n1.6,2.5,yes\n1.7,3.1,no\n1.8,1.0,yes\n",
        "# scan\n1.0;-40.1\n1.1;-40.09\n1.2;-40.1\n",
        "\"d\"\t\"E [kJ/mol]\"\n2.0\t0\n2.1\t5.5\n",
    ];

    private static readonly string[] s_qcCorpus = [QcSchemaReaderTests.Energy, HessianQc()];

    private static string HessianQc()
    {
        var h = new double[81];
        for (var i = 0; i < 9; i++) h[i * 9 + i] = 0.5;
        return QcSchemaReaderTests.Energy.Replace("\"driver\": \"energy\"", "\"driver\": \"hessian\"")
            .Replace("\"return_result\": -76.0266", "\"return_result\": [" + string.Join(",", h.Select(v => v.ToString(CultureInfo.InvariantCulture))) + "]");
    }

    private static readonly string[] s_vocabulary =
    [
        "0", "1", "-1", "3", "2.5", "-76.4", "1e308", "1e-320", "NaN", "Infinity", "-0", "99999999999", "1,5", "1D-3",
        "H", "C", "O", "Cl", "Xx", "118", "energy=", "charge=", "multiplicity=", "Properties=species:S:1:pos:R:3", "Lattice=",
        "\"", "\"quoted value\"", "{", "}", "[", "]", ":", ",", ";", "\t", " ", "\n", "\r\n", "=", "#", "yes", "no",
        "\"schema_name\"", "\"qcschema_output\"", "\"format\"", "\"barrierledger-bundle\"", "\"molecule\"", "\"symbols\"",
        "\"geometry\"", "\"driver\"", "\"hessian\"", "\"return_result\"", "\"species\"", "\"calculations\"", "\"file\"",
        "\"../x\"", "null", "true", "false", "\u00e9", "\u200b", "\0",
    ];

    private sealed record Tally(int Inputs, int Succeeded, double ReadSeconds, double TotalSeconds, double SlowestMs);

    /// <summary>
    /// Reads every input on one worker thread while this thread watches the clock: an input still running after
    /// <see cref="s_perInput"/> fails the test as a hang (the worker is a background thread and is abandoned).
    /// </summary>
    private static Tally Run(string name, IEnumerable<byte[]> inputs, Func<Stream, bool> read)
    {
        var total = Stopwatch.StartNew();
        int count = 0, ok = 0;
        double readMs = 0, slowest = 0;
        long startedAt = -1;
        byte[]? current = null;
        Exception? failure = null;
        var done = false;
        var worker = new Thread(() =>
        {
            try
            {
                foreach (var input in inputs)
                {
                    Volatile.Write(ref current, input);
                    var t0 = Stopwatch.GetTimestamp();
                    Volatile.Write(ref startedAt, t0);
                    try
                    {
                        if (read(new MemoryStream(input, writable: false))) ok++;
                    }
                    catch (Exception ex)
                    {
                        failure = new Xunit.Sdk.XunitException($"{name}: input {count} threw {ex}:\n{Preview(input)}");
                        return;
                    }
                    var ms = Stopwatch.GetElapsedTime(t0).TotalMilliseconds;
                    Volatile.Write(ref startedAt, -1);
                    readMs += ms;
                    slowest = Math.Max(slowest, ms);
                    count++;
                }
            }
            finally { Volatile.Write(ref done, true); }
        }) { IsBackground = true, Name = "fuzz-" + name };
        worker.Start();
        while (!Volatile.Read(ref done))
        {
            Thread.Sleep(20);
            var t0 = Volatile.Read(ref startedAt);
            if (t0 >= 0 && Stopwatch.GetElapsedTime(t0) > s_perInput)
                throw new Xunit.Sdk.XunitException($"{name}: input {count} did not finish within {s_perInput.TotalSeconds} s:\n{Preview(Volatile.Read(ref current)!)}");
        }
        worker.Join();
        if (failure is not null) throw failure;
        return new Tally(count, ok, readMs / 1000, total.Elapsed.TotalSeconds, slowest);
    }

    private static string Preview(byte[] input) => Encoding.UTF8.GetString(input.AsSpan(0, Math.Min(input.Length, 400)));

    /// <summary>Checks the contract of a result and returns whether it carries a value.</summary>
    private static bool Check<T>(ReadResult<T> r) where T : class
    {
        if (r.Succeeded == r.Issues.Any(i => i.IsError)) throw new InvalidOperationException("value and errors disagree");
        foreach (var i in r.Issues)
        {
            if (string.IsNullOrWhiteSpace(i.Message) || string.IsNullOrEmpty(i.FileName)) throw new InvalidOperationException("issue without message or file");
            if (i.Line is < 1) throw new InvalidOperationException($"line {i.Line}");
            if (i.JsonPath is { } p && !p.StartsWith('$')) throw new InvalidOperationException($"path {p}");
        }
        return r.Succeeded;
    }

    private static IEnumerable<byte[]> Inputs(Random rng, string[] corpus, bool json)
    {
        for (var k = 0; k < InputsPerReader; k++)
        {
            switch (k % 4)
            {
                case 0: // random bytes
                    var bytes = new byte[rng.Next(0, 400)];
                    rng.NextBytes(bytes);
                    yield return bytes;
                    break;
                case 1: // random tokens
                    var sb = new StringBuilder();
                    var n = rng.Next(0, 80);
                    for (var i = 0; i < n; i++) sb.Append(s_vocabulary[rng.Next(s_vocabulary.Length)]).Append(rng.Next(3) == 0 ? "\n" : " ");
                    yield return Encoding.UTF8.GetBytes(sb.ToString());
                    break;
                case 2: // text mutations of a valid file
                    yield return Encoding.UTF8.GetBytes(MutateText(rng, corpus[rng.Next(corpus.Length)]));
                    break;
                default: // structural mutations for JSON, more text mutations otherwise
                    var baseline = corpus[rng.Next(corpus.Length)];
                    yield return Encoding.UTF8.GetBytes(json ? MutateJson(rng, baseline) : MutateText(rng, MutateText(rng, baseline)));
                    break;
            }
        }
    }

    private static string MutateText(Random rng, string text)
    {
        var s = new StringBuilder(text);
        var edits = rng.Next(1, 5);
        for (var e = 0; e < edits && s.Length > 0; e++)
        {
            var at = rng.Next(s.Length);
            switch (rng.Next(6))
            {
                case 0: s[at] = (char)rng.Next(1, 128); break;
                case 1: s.Remove(at, Math.Min(rng.Next(1, 20), s.Length - at)); break;
                case 2: s.Insert(at, s_vocabulary[rng.Next(s_vocabulary.Length)]); break;
                case 3: s.Length = at; break;
                case 4:
                    var lines = s.ToString().Split('\n').ToList();
                    var li = rng.Next(lines.Count);
                    lines.Insert(rng.Next(lines.Count), lines[li]);
                    s.Clear().Append(string.Join('\n', lines));
                    break;
                default:
                    var digits = s.ToString().IndexOfAny("0123456789".ToCharArray(), at);
                    if (digits >= 0) s.Insert(digits, rng.Next(2) == 0 ? "9999999" : "-");
                    break;
            }
        }
        return s.ToString();
    }

    private static readonly JsonNode?[] s_jsonValues =
        [null, 0, -1, 1.5, 1e300, "", "x", "H", "../x", true, new JsonArray(), new JsonObject(), new JsonArray(1, 2, 3), new JsonArray("H", "H")];

    private static string MutateJson(Random rng, string json)
    {
        var root = JsonNode.Parse(json)!;
        var edits = rng.Next(1, 4);
        for (var e = 0; e < edits; e++)
        {
            var nodes = new List<JsonNode>();
            Collect(root, nodes);
            var target = nodes[rng.Next(nodes.Count)];
            var replacement = s_jsonValues[rng.Next(s_jsonValues.Length)]?.DeepClone();
            switch (target.Parent)
            {
                case JsonObject o:
                    var key = o.First(p => ReferenceEquals(p.Value, target)).Key;
                    if (rng.Next(3) == 0) o.Remove(key); else o[key] = replacement;
                    break;
                case JsonArray a:
                    var idx = a.IndexOf(target);
                    if (rng.Next(3) == 0) a.RemoveAt(idx); else a[idx] = replacement;
                    break;
            }
        }
        return root.ToJsonString();
    }

    private static void Collect(JsonNode node, List<JsonNode> into)
    {
        if (node.Parent is not null) into.Add(node);
        if (node is JsonObject o) foreach (var p in o) { if (p.Value is not null) Collect(p.Value, into); }
        else if (node is JsonArray a) foreach (var x in a) { if (x is not null) Collect(x, into); }
        if (into.Count == 0) into.Add(node);
    }

    private void Report(string reader, Tally t) =>
        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"fuzz {reader}: {t.Inputs} inputs, {t.Succeeded} read successfully, reading {t.ReadSeconds:F2} s (with input generation {t.TotalSeconds:F2} s), slowest input {t.SlowestMs:F1} ms, no exception, no hang"));

    [Fact]
    public void Xyz_reader_survives_random_and_mutated_inputs()
    {
        var t = Run("xyz", Inputs(new Random(20261202), s_xyzCorpus, json: false), s => Check(XyzReader.Read(s, "fuzz.xyz", s_limits)));
        Report("xyz/extended xyz", t);
        Assert.Equal(InputsPerReader, t.Inputs);
        Assert.True(t.Succeeded > 0, "no mutated input was readable: the mutations are too destructive to test the accepting paths");
    }

    [Fact]
    public void Csv_scan_reader_survives_random_and_mutated_inputs()
    {
        var t = Run("csv", Inputs(new Random(31), s_csvCorpus, json: false), s => Check(ScanTableReader.Read(s, "fuzz.csv", null, s_limits)));
        Report("csv scan", t);
        Assert.Equal(InputsPerReader, t.Inputs);
        Assert.True(t.Succeeded > 0);
    }

    [Fact]
    public void QcSchema_reader_survives_random_and_mutated_inputs()
    {
        var t = Run("qcschema", Inputs(new Random(47), s_qcCorpus, json: true), s => Check(QcSchemaReader.Read(s, "fuzz.json", s_limits)));
        Report("qcschema", t);
        Assert.Equal(InputsPerReader, t.Inputs);
        Assert.True(t.Succeeded > 0);
    }

    [Fact]
    public void Bundle_reader_survives_random_and_mutated_manifests_and_zips()
    {
        var sample = File.ReadAllText(RepoFiles.Sample("sample-bundle.json"));
        var files = new[] { "h2.xyz", "ts1.xyz", "scans/c1h5.csv", "scans/c1h5.xyz" }.ToDictionary(f => f, f => File.ReadAllBytes(RepoFiles.Sample(f)));
        Stream? Open(string p) => files.TryGetValue(p, out var b) ? new MemoryStream(b) : null;
        var zip = BundleReaderTests.SampleZip();
        var rng = new Random(59);
        IEnumerable<byte[]> All()
        {
            var k = 0;
            foreach (var input in Inputs(new Random(61), [sample], json: true))
            {
                // Every fifth input is a zip: the sample zip with bytes flipped, cut or entries rebuilt with mutated content.
                if (k++ % 5 == 4)
                {
                    var z = (byte[])zip.Clone();
                    switch (rng.Next(3))
                    {
                        case 0: for (var i = 0; i < rng.Next(1, 6); i++) z[rng.Next(z.Length)] ^= (byte)rng.Next(1, 256); yield return z; break;
                        case 1: yield return z[..rng.Next(z.Length)]; break;
                        default:
                            yield return BundleReaderTests.Zip(files.Select(f => (f.Key, rng.Next(4) == 0 ? Encoding.UTF8.GetBytes(MutateText(rng, Encoding.UTF8.GetString(f.Value))) : f.Value))
                                .Prepend(("bundle.json", input)));
                            break;
                    }
                }
                else yield return input;
            }
        }
        var t = Run("bundle", All(), s => Check(BundleReader.Read(s, "fuzz.zip", s_limits, Open)));
        Report("bundle (json and zip)", t);
        Assert.Equal(InputsPerReader, t.Inputs);
        Assert.True(t.Succeeded > 0);
    }
}
