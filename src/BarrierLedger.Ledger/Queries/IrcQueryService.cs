using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Queries;

/// <summary>One stored IRC structure: its place, role, signed path length from the saddle point (Å, a path only), energy (hartree) and geometry.</summary>
public sealed record IrcFrameView(int Index, IrcFrameRole Role, double? PathLengthAngstrom, double? EnergyHartree, Molecule Geometry);

/// <summary>An IRC as the screens show it: a path (frames in order) or an endpoint pair, with the saddle geometry it was followed from.</summary>
public sealed record IrcView(int Id, int SaddleCalculationId, string Label, string LevelOfTheory, IrcForm Form, int? SaddleFrame,
    Molecule Saddle, double? SaddleEnergyHartree, IReadOnlyList<IrcFrameView> Frames);

/// <summary>Reads one IRC with its frames, on demand (a path may hold thousands of frames, so the reaction screen does not load it up front).</summary>
public sealed class IrcQueryService(IDbContextFactory<LedgerDbContext> factory)
{
    /// <summary>The IRC, or null when there is none with this id or it was retired.</summary>
    public async Task<IrcView?> GetAsync(int ircId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var irc = await db.Ircs.AsNoTracking().Include(i => i.Frames).Include(i => i.SaddleCalculation).ThenInclude(c => c!.Species)
            .Where(i => i.Id == ircId && !i.Retired).FirstOrDefaultAsync(ct);
        if (irc?.SaddleCalculation is not { Species: { } sp } calc) return null;
        var elements = Blobs.ToElements(irc.AtomicNumbers);
        var saddle = Blobs.ToMolecule(calc.AtomicNumbers, calc.PositionsAngstrom, sp.Charge, sp.Multiplicity)
                     ?? throw new InvalidOperationException($"IRC {irc.Id}: its saddle-point calculation {calc.Label} has no geometry.");
        var frames = irc.Frames.OrderBy(f => f.Index)
            .Select(f => new IrcFrameView(f.Index, f.Role, f.PathLengthAngstrom, f.EnergyHartree, new Molecule(elements, Blobs.ToPositions(f.PositionsAngstrom), sp.Charge, sp.Multiplicity)))
            .ToList();
        return new IrcView(irc.Id, calc.Id, irc.Label, irc.LevelOfTheory, irc.Form, irc.SaddleFrame, saddle, calc.EnergyHartree, frames);
    }
}
