using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Vibrations;
using BarrierLedger.Ledger.Storage;

namespace BarrierLedger.Ledger.Tests.Storage;

public class BlobsTests
{
    private static readonly NormalMode s_mode = new(-512.5, ImmutableArray.Create(new Vec3(0.6, 0, 0), new Vec3(-0.8, 0, 0)), 1.0078, -155.2);

    [Fact]
    public void Modes_RoundTrip_KeepWavenumberMassAndForceConstantInNewtonPerMetre()
    {
        var back = Blobs.ToModes(Blobs.FromModes([s_mode]), 2).Single();
        Assert.Equal(s_mode.FrequencyCm1, back.FrequencyCm1);
        Assert.Equal(s_mode.ReducedMassDalton, back.ReducedMassDalton);
        Assert.Equal(s_mode.ForceConstantNewtonPerMetre, back.ForceConstantNewtonPerMetre, 12);
        Assert.Equal(s_mode.DisplacementCartesian.ToArray(), back.DisplacementCartesian.ToArray());
    }

    [Fact]
    public void Modes_StoredBlob_HoldsTheForceConstantInMdynPerAngstrom_AsLedgersWereFirstWritten()
    {
        // Blob layout per mode: wavenumber, reduced mass, force constant, then 3N displacements; little-endian doubles.
        // A ledger written before the SI rename holds mdyn/Å in the third slot; 1 mdyn/Å = 100 N/m exactly.
        var values = Blobs.ToDoubles(Blobs.FromModes([s_mode]));
        Assert.Equal(-1.552, values[2], 12);
        var legacy = Blobs.FromDoubles([-512.5, 1.0078, -1.552, 0.6, 0, 0, -0.8, 0, 0]);
        Assert.Equal(-155.2, Blobs.ToModes(legacy, 2).Single().ForceConstantNewtonPerMetre, 10);
    }
}
