using System.Text;
using BarrierLedger.Ledger.Uploads;

namespace BarrierLedger.Ledger.Tests.Support;

/// <summary>
/// Entry point of this test assembly when run as a program: "upload-until-killed DIR FRAMES ATOMS" opens the ledger in DIR,
/// stores one small upload to warm up, prints "ready", then stores one large scan upload after another, printing
/// "begin KEY" before and "stored KEY" after each commit, until the parent kills it. Without arguments it does nothing.
/// </summary>
public static class ChildProcess
{
    public const string Mode = "upload-until-killed";

    public static async Task<int> Main(string[] args)
    {
        if (args.Length != 4 || args[0] != Mode) return 0;
        var ledger = await TempLedger.CreateAsync(args[1]);
        var frames = int.Parse(args[2], System.Globalization.CultureInfo.InvariantCulture);
        var atoms = int.Parse(args[3], System.Globalization.CultureInfo.InvariantCulture);
        var bytes = Encoding.UTF8.GetBytes(H3System.ScanXyz(frames, atoms));
        var uploads = ledger.Get<UploadService>();
        var id = Environment.ProcessId;
        // Two small uploads first (a new and an existing study), so the large ones run at steady speed.
        for (var w = 0; w < 2; w++)
        {
            var warm = await uploads.StoreAsync([new UploadFile($"warm-{id}-{w}.xyz", Encoding.UTF8.GetBytes(H3System.ScanXyz(3, atoms)))],
                H3System.ScanChoices("Crash study", "chain", $"warm-{id}-{w}"), "child");
            if (!warm.Stored) { Console.Error.WriteLine(string.Join("\n", warm.Errors)); return 2; }
        }
        Console.WriteLine("ready");
        for (var n = 0; ; n++)
        {
            var key = $"child-{id}-{n}";
            Console.WriteLine($"begin {key}");
            var outcome = await uploads.StoreAsync([new UploadFile($"scan-{key}.xyz", bytes)], H3System.ScanChoices("Crash study", "chain", key), "child");
            if (!outcome.Stored) { Console.Error.WriteLine(string.Join("\n", outcome.Errors)); return 2; }
            Console.WriteLine($"stored {key}");
        }
    }
}
