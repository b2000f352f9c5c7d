using System.Data;
using BarrierLedger.Core.Symmetry;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Storage;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>The point group found for one species, from the geometry of one calculation.</summary>
internal sealed record SymmetryFound(int SpeciesId, int CalculationId, string PointGroup, int SymmetryNumber, string Note);

/// <summary>
/// Keeps each species' point group and σ in step with its geometry: the structure detected is the one its thermochemistry
/// uses (<see cref="StateResolver.ThermalCalculation"/>: the calculation with frequencies the energy model picks; without one,
/// the newest optimised minimum or saddle point, else any geometry). Detection is Core's <see cref="PointGroups.Detect"/> at its
/// default tolerance. The σ used is the override when one was given (a bundle's <c>symmetry_number</c> or a member's
/// correction), else the detected one.
/// </summary>
internal static class SpeciesSymmetry
{
    /// <summary>The σ a species' thermochemistry uses.</summary>
    public static int Effective(int? overrideValue, int? detected) => Math.Max(1, overrideValue ?? detected ?? 1);

    /// <summary>
    /// Detects the point group of every species of <paramref name="inputs"/> whose chosen geometry is not the one detected last
    /// time, updates the inputs' σ in place, and returns what was found (for <see cref="WriteAsync"/>).
    /// </summary>
    public static List<SymmetryFound> Refresh(ModelSettings model, DerivationInputs inputs)
    {
        var thermalKey = EnergyLevels.Key(model.ThermalLevel);
        var found = new List<SymmetryFound>();
        foreach (var sp in inputs.Species.Values.ToList())
        {
            var calcs = inputs.CalculationsBySpecies[sp.Id].ToList();
            var source = StateResolver.ThermalCalculation(calcs, thermalKey, null) ?? GeometryCalculation(calcs);
            if (source is null || source.Id == sp.SymmetryCalculationId) continue;
            if (Detect(source, sp) is not { } f) continue;
            found.Add(f);
            inputs.Species[sp.Id] = sp with { SymmetryCalculationId = f.CalculationId, PointGroup = f.PointGroup, SymmetryNumber = Effective(sp.SymmetryNumberOverride, f.SymmetryNumber) };
        }
        return found;
    }

    /// <summary>The newest optimised structure, else the newest calculation with any geometry.</summary>
    private static CalcInput? GeometryCalculation(List<CalcInput> calcs) =>
        calcs.LastOrDefault(c => c.AtomicNumbers is { Length: > 0 } && c.Positions is not null && c.Kind is CalculationKind.Minimum or CalculationKind.SaddlePoint)
        ?? calcs.LastOrDefault(c => c.AtomicNumbers is { Length: > 0 } && c.Positions is not null);

    private static SymmetryFound? Detect(CalcInput c, SpeciesInput sp)
    {
        var molecule = Blobs.ToMolecule(c.AtomicNumbers, c.Positions, sp.Charge, sp.Multiplicity);
        if (molecule is null) return null;
        var r = PointGroups.Detect(molecule);
        return new SymmetryFound(sp.Id, c.Id, r.Group.Name, r.SymmetryNumber, r.Note);
    }

    /// <summary>Stores what <see cref="Refresh"/> found, in the caller's transaction, with one prepared statement.</summary>
    public static async Task WriteAsync(LedgerDbContext db, IReadOnlyList<SymmetryFound> found, CancellationToken ct)
    {
        if (found.Count == 0) return;
        var connection = db.Database.GetDbConnection();
        if (connection.State != ConnectionState.Open) await connection.OpenAsync(ct);
        await using var cmd = connection.CreateCommand();
        cmd.Transaction = db.Database.CurrentTransaction?.GetDbTransaction();
        // σ in use follows the detection unless an override is stored (a bundle's or a member's, which wins).
        cmd.CommandText = """
            UPDATE "Species" SET "PointGroup" = @g, "DetectedSymmetryNumber" = @d, "SymmetryNote" = @n, "SymmetryCalculationId" = @c,
                "SymmetryNumber" = COALESCE("SymmetryNumberOverride", @d)
            WHERE "Id" = @id
            """;
        var g = StoreSql.Parameter(cmd, "@g", DbType.String);
        var d = StoreSql.Parameter(cmd, "@d", DbType.Int32);
        var n = StoreSql.Parameter(cmd, "@n", DbType.String);
        var c = StoreSql.Parameter(cmd, "@c", DbType.Int32);
        var id = StoreSql.Parameter(cmd, "@id", DbType.Int32);
        var first = true;
        foreach (var f in found)
        {
            (g.Value, d.Value, n.Value, c.Value, id.Value) = (f.PointGroup, f.SymmetryNumber, f.Note, f.CalculationId, f.SpeciesId);
            if (first) { await cmd.PrepareAsync(ct); first = false; }
            await cmd.ExecuteNonQueryAsync(ct);
        }
    }
}
