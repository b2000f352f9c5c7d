using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Tests.Checks;

public class ModeBondPredictionTests
{
    /// <summary>
    /// Each demo reaction's bond changes, as chemistry textbooks give them for these reaction types (Diels–Alder: two new C–C σ
    /// bonds; S_N2 methyl transfer: one bond to the nucleophile forms, one to the leaving group breaks; electrocyclic ring opening
    /// of cyclobutene: one C–C σ bond breaks; 1,3-hydrogen shift: C–H breaks, O–H forms; HF elimination: C–F and C–H break, H–F forms).
    /// </summary>
    public static TheoryData<string, string, string> BondChanges => new()
    {
        { "DA", "TS", "+2 C–C" },
        { "MT", "TS", "−1 C–Cl, +1 C–N" },
        { "IX", "TS1", "−1 C–Cl, +1 C–I" },
        { "IX", "TS2", "+1 C–F, −1 C–I" },
        { "CB", "TS", "−1 C–C" },
        { "KE", "TS", "−1 C–H, +1 H–O" },
        { "EL", "TS", "−1 C–F, −1 C–H, +1 H–F" },
    };

    [Theory]
    [MemberData(nameof(BondChanges))]
    public void The_demo_states_differ_by_the_textbook_bond_changes(string reaction, string state, string change)
    {
        var (_, _, saddle, before, after) = DemoBundleStates.Saddles().Single(s => s.Reaction == reaction && s.State == state);
        var p = ModeBondPrediction.Run(saddle.Geometry!, DemoBundleStates.ImaginaryMode(saddle), before, after);
        Assert.NotNull(p.StateChange);
        Assert.Equal(change, ModeBondPrediction.Kinds(p.StateChange!));
    }

    [Theory]
    [InlineData("DA", "TS")]
    [InlineData("MT", "TS")]
    [InlineData("IX", "TS1")]
    [InlineData("IX", "TS2")]
    [InlineData("CB", "TS")]
    [InlineData("KE", "TS")]
    public void The_mode_of_each_real_demo_saddle_point_leads_to_its_neighbouring_states(string reaction, string state)
    {
        var (_, _, saddle, before, after) = DemoBundleStates.Saddles().Single(s => s.Reaction == reaction && s.State == state);
        var p = ModeBondPrediction.Run(saddle.Geometry!, DemoBundleStates.ImaginaryMode(saddle), before, after);
        Assert.True(p.Outcome == ModePredictionOutcome.Agrees, string.Join("\n", p.Reasons));
        Assert.Equal(ModePredictionCodes.Agrees, p.Reasons.Single().Code);
        // The bonds that change under the displacement are exactly the reaction's, counted by kind (the independent reading above).
        var kinds = p.PlusOnly.Select(b => Kind(p.Plus, b)).Concat(p.MinusOnly.Select(b => Kind(p.Plus, b))).Order().ToList();
        var expected = p.StateChange!.SelectMany(kv => Enumerable.Repeat(kv.Key, Math.Abs(kv.Value))).Order().ToList();
        Assert.Equal(expected, kinds);
    }

    [Fact]
    public void The_rotamer_saddle_point_of_HF_is_caught_its_mode_forms_no_bond()
    {
        // TS-EL is the eclipsed rotamer of fluoroethane: its imaginary mode turns the methyl group (see DemoShowcaseTests).
        var (_, _, saddle, before, after) = DemoBundleStates.Saddles().Single(s => s.Reaction == "EL");
        var p = ModeBondPrediction.Run(saddle.Geometry!, DemoBundleStates.ImaginaryMode(saddle), before, after);
        Assert.Equal(ModePredictionOutcome.Disagrees, p.Outcome);
        Assert.Empty(p.PlusOnly);
        Assert.Empty(p.MinusOnly);
        var reason = p.Reasons.Single();
        Assert.Equal(CheckSeverity.Attention, reason.Severity);
        Assert.Contains("no bond forms or breaks", reason.Message);
        Assert.Contains("−1 C–F, −1 C–H, +1 H–F", reason.Message);
    }

    [Fact]
    public void Amplitude_moves_the_fastest_changing_distance_by_the_stated_amount()
    {
        // Property of the construction (stated in ModePredictionOptions): the fastest-changing distance changes by 0.5 Å to first order.
        var (_, _, saddle, before, after) = DemoBundleStates.Saddles().Single(s => s.Reaction == "DA");
        var mode = DemoBundleStates.ImaginaryMode(saddle);
        var p = ModeBondPrediction.Run(saddle.Geometry!, mode, before, after);
        var top = DistanceChanges.Along(saddle.Geometry!, mode.DisplacementCartesian)[0];
        Assert.Equal(0.5, Math.Abs(top.ChangePerUnitDisplacement) * p.AmplitudeAngstrom, 12);
        var r = (Molecule m) => (m.PositionsAngstrom[top.Pair.A] - m.PositionsAngstrom[top.Pair.B]).Length;
        // Second-order terms make the actual change differ slightly from 0.5 Å: within 0.1 Å each way (common practice, no source).
        Assert.InRange(Math.Abs(r(p.Plus) - top.DistanceAngstrom), 0.4, 0.6);
        Assert.InRange(Math.Abs(r(p.Minus) - top.DistanceAngstrom), 0.4, 0.6);
    }

    private static string Kind(Molecule m, Bond b)
    {
        // Same Hill-like order as the library: C first, H second, else alphabetical.
        string x = m.Elements[b.A].Symbol, y = m.Elements[b.B].Symbol;
        static int Rank(string s) => s == "C" ? 0 : s == "H" ? 1 : 2;
        var swap = Rank(y) < Rank(x) || (Rank(x) == Rank(y) && string.CompareOrdinal(y, x) < 0);
        return swap ? $"{y}–{x}" : $"{x}–{y}";
    }
}
