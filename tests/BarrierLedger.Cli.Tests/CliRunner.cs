using BarrierLedger.Cli;

namespace BarrierLedger.Cli.Tests;

/// <summary>Runs the command line in-process and captures what it prints.</summary>
internal static class CliRunner
{
    public static (int Code, string Out, string Err) Run(params string[] args)
    {
        var o = new StringWriter();
        var e = new StringWriter();
        var code = Program.Run(args, o, e);
        return (code, o.ToString(), e.ToString());
    }
}

/// <summary>A temporary folder deleted after the test.</summary>
internal sealed class TempDir : IDisposable
{
    public string Path { get; } = Directory.CreateTempSubdirectory("bl-cli-").FullName;

    public string Write(string name, string content)
    {
        var p = System.IO.Path.Combine(Path, name);
        File.WriteAllText(p, content);
        return p;
    }

    public string WriteBytes(string name, byte[] content)
    {
        var p = System.IO.Path.Combine(Path, name);
        File.WriteAllBytes(p, content);
        return p;
    }

    public void Dispose()
    {
        try { Directory.Delete(Path, true); } catch (IOException) { }
    }
}
