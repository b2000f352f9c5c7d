namespace BarrierLedger.Cli;

public static class Program
{
    public static int Main(string[] args)
    {
        Console.WriteLine("barrierledger: commands are not built yet.");
        return 0;
    }
}
