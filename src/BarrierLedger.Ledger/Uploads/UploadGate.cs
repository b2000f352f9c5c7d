namespace BarrierLedger.Ledger.Uploads;

/// <summary>"BarrierLedger:Uploads": how many uploads are read and checked at once, and how long another one waits for a turn.</summary>
public sealed class UploadReadOptions
{
    /// <summary>Uploads read at once (preview or store). Reading a 60 MiB XYZ holds several hundred MiB while it runs. Default 1.</summary>
    public int ConcurrentReads { get; set; } = 1;

    /// <summary>Seconds an upload waits for a turn before it is answered "busy, try again". Default 60 (a waiting upload holds
    /// only its own bytes; small uploads queue behind a large one instead of being refused).</summary>
    public double WaitSeconds { get; set; } = 60;

    /// <summary>
    /// Storage quota per user in MiB ("BarrierLedger:Uploads:UserQuotaMiB"): the original files one user may store in all. An upload
    /// that would take a user past it is refused whole. 0 or less: no quota. Default 2048 (2 GiB).
    /// </summary>
    public long UserQuotaMiB { get; set; } = 2048;
}

/// <summary>The server is reading as many uploads as it reads at once; the message says so and when to try again.</summary>
public sealed class UploadsBusyException(int concurrent, TimeSpan retryAfter) : Exception(
    $"The server is busy reading {(concurrent == 1 ? "another upload" : $"{concurrent} other uploads")} (it reads {concurrent} at a time to bound its memory); nothing was read or stored. Try again in {retryAfter.TotalSeconds:0} seconds.")
{
    public TimeSpan RetryAfter { get; } = retryAfter;
}

/// <summary>
/// Bounds how many uploads are read and checked at once (issue 19, finding 7): reading holds the parsed file in memory, so
/// without a bound a few large uploads at once can take gigabytes. An upload that finds no turn within the wait is refused with
/// <see cref="UploadsBusyException"/> instead of queueing without end.
/// </summary>
public sealed class UploadGate(UploadReadOptions options)
{
    private readonly SemaphoreSlim _turns = new(Math.Max(1, options.ConcurrentReads));

    public int Concurrent { get; } = Math.Max(1, options.ConcurrentReads);

    /// <summary>A turn, released when disposed.</summary>
    /// <exception cref="UploadsBusyException">No turn came free within the configured wait.</exception>
    /// <param name="bytes">The size of the files to be read: after a large read the memory it took is handed back (see <see cref="LargeReadBytes"/>).</param>
    public async Task<IDisposable> EnterAsync(long bytes = 0, CancellationToken ct = default)
    {
        if (!await _turns.WaitAsync(TimeSpan.FromSeconds(Math.Max(0, options.WaitSeconds)), ct))
            throw new UploadsBusyException(Concurrent, TimeSpan.FromSeconds(30));
        return new Turn(_turns, bytes >= LargeReadBytes);
    }

    /// <summary>
    /// From this size on (16 MiB) the end of a read compacts the heap and returns the free memory to the system: the read's
    /// large arrays would otherwise stay resident until some later collection, and the next large read would stack on them.
    /// </summary>
    public const long LargeReadBytes = 16L * 1024 * 1024;

    private sealed class Turn(SemaphoreSlim turns, bool large) : IDisposable
    {
        private int _released;
        public void Dispose()
        {
            if (Interlocked.Exchange(ref _released, 1) != 0) return;
            turns.Release();
            if (large) GC.Collect(GC.MaxGeneration, GCCollectionMode.Aggressive, blocking: true, compacting: true);
        }
    }
}
