using System.Globalization;

namespace BarrierLedger.LoadHarness;

/// <summary>Command-line settings of the harness (see <see cref="Usage"/>).</summary>
internal sealed class HarnessOptions
{
    public List<string> Urls { get; } = [];
    public List<int> Pids { get; } = [];
    public bool Start => Urls.Count == 0;
    public int Reactions { get; private set; } = 2000;
    public string? Bundle { get; private set; }
    public int Users { get; private set; } = 30;
    public int Seconds { get; private set; } = 60;
    public int Loads { get; private set; } = 50;
    public int ThinkMs { get; private set; } = 1000;
    public bool Keep { get; private set; }
    public string? FromCopy { get; private set; }
    public string? GcDump { get; private set; }
    public string? WebDll { get; private set; }
    public bool UploadMemory { get; private set; }
    public int UploadMiB { get; private set; } = 60;
    public int UploadConcurrency { get; private set; } = 3;
    public (string Name, string Password) Reviewer { get; private set; } = ("demo-reviewer", "Demo-reviewer-2026");
    public (string Name, string Password) Member { get; private set; } = ("demo-member", "Demo-member-2026");

    public const string Usage = """
        BarrierLedger load harness: prints server render times of the ledger and reaction pages and the latencies, errors and
        memory of concurrent users, each with a real Blazor Server circuit. A timed harness, not a test.

        dotnet run -c Release --project tests/BarrierLedger.LoadHarness -- [options]

          (no --url)           start the app built beside this harness on a fresh data directory, with the demo study and
                               demo accounts, and fill it with --reactions reactions before measuring
          --url URL            measure a running app instead (repeat for several instances behind one database: users are
                               assigned round-robin and stay on theirs); its store must hold the large ledger and the accounts
          --pid PID            with --url: the app process(es) whose memory to read from /proc (else memory is not measured)
          --reactions N        reactions to store in the fresh ledger (default 2000; 25 per study)
          --bundle DIR         store the study folders written by `barrierledger demo generate --reactions N --out DIR` instead
          --users N            concurrent simulated users (default 30)
          --seconds N          how long the users browse (default 60; a round begun before the end is finished)
          --loads N            timed loads of each page for the render times (default 50)
          --think-ms N         mean pause of a user between steps (default 1000; each pause is 0.5–1.5 times it)
          --reviewer NAME:PW   account of the even-numbered users, who also open the review queue (default the demo reviewer)
          --member NAME:PW     account of the odd-numbered users (default the demo member)
          --web-dll PATH       the app to start (default src/BarrierLedger.Web/bin/<this configuration>/net10.0/BarrierLedger.Web.dll)
          --gcdump PATH        the dotnet-gcdump tool: also report the live managed heap (after a full collection) before the
                               run and with the circuits open, which RSS overstates by the garbage not yet collected
          --keep               keep the fresh data directory (its path is printed)
          --from-copy DIR      start on a fresh copy of a data directory kept with --keep instead of filling one (saves the
                               minutes that storing the reactions takes)
          --upload-memory      instead: the app's peak resident memory (VmHWM) while one, then --upload-concurrency, XYZ
                               relaxed scans of --upload-mib MiB are previewed through the API, and the time to read one
          --upload-mib N       size of the generated XYZ (default 60)
          --upload-concurrency N  previews at once in the second step (default 3)
        """;

    public static HarnessOptions Parse(string[] args)
    {
        var o = new HarnessOptions();
        for (var i = 0; i < args.Length; i++)
        {
            string Next() => i + 1 < args.Length ? args[++i] : throw new ArgumentException($"{args[i]} needs a value.");
            int Count(int min) => int.TryParse(Next(), NumberStyles.None, CultureInfo.InvariantCulture, out var n) && n >= min
                ? n : throw new ArgumentException($"{args[i - 1]} needs a whole number of at least {min}, got '{args[i]}'.");
            (string, string) Account() => Next().Split(':', 2) is [var n, var p] && n.Length > 0
                ? (n, p) : throw new ArgumentException($"{args[i - 1]} needs NAME:PASSWORD.");
            switch (args[i])
            {
                case "--url": o.Urls.Add(Next().TrimEnd('/')); break;
                case "--pid": o.Pids.Add(Count(1)); break;
                case "--reactions": o.Reactions = Count(1); break;
                case "--bundle": o.Bundle = Path.GetFullPath(Next()); break;
                case "--users": o.Users = Count(1); break;
                case "--seconds": o.Seconds = Count(1); break;
                case "--loads": o.Loads = Count(1); break;
                case "--think-ms": o.ThinkMs = Count(0); break;
                case "--reviewer": o.Reviewer = Account(); break;
                case "--member": o.Member = Account(); break;
                case "--web-dll": o.WebDll = Path.GetFullPath(Next()); break;
                case "--keep": o.Keep = true; break;
                case "--gcdump": o.GcDump = Path.GetFullPath(Next()); break;
                case "--from-copy": o.FromCopy = Path.GetFullPath(Next()); break;
                case "--upload-memory": o.UploadMemory = true; break;
                case "--upload-mib": o.UploadMiB = Count(1); break;
                case "--upload-concurrency": o.UploadConcurrency = Count(1); break;
                default: throw new ArgumentException($"Unknown option '{args[i]}'.");
            }
        }
        if (o.FromCopy is not null && !File.Exists(Path.Combine(o.FromCopy, "barrierledger.db")))
            throw new ArgumentException($"--from-copy: no barrierledger.db in {o.FromCopy}.");
        if (o.Bundle is not null && !Directory.Exists(o.Bundle)) throw new ArgumentException($"--bundle: no folder {o.Bundle}.");
        if (o.GcDump is not null && !File.Exists(o.GcDump)) throw new ArgumentException($"--gcdump: no file {o.GcDump}.");
        if (o.Pids.Count > 0 && o.Start) throw new ArgumentException("--pid goes with --url (the harness knows the app it starts).");
        return o;
    }

    /// <summary>The app built with the same configuration as this harness.</summary>
    public string WebDllPath()
    {
        if (WebDll is not null) return WebDll;
        var configuration = AppContext.BaseDirectory.Contains($"{Path.DirectorySeparatorChar}Release{Path.DirectorySeparatorChar}", StringComparison.Ordinal) ? "Release" : "Debug";
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
            if (File.Exists(Path.Combine(dir.FullName, "BarrierLedger.sln")))
                return Path.Combine(dir.FullName, "src", "BarrierLedger.Web", "bin", configuration, "net10.0", "BarrierLedger.Web.dll");
        throw new DirectoryNotFoundException("BarrierLedger.sln not found above " + AppContext.BaseDirectory + "; give --web-dll.");
    }
}
