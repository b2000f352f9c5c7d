using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;

namespace BarrierLedger.Ledger.Tests.Derivation;

public sealed class DerivationServiceTests
{
    /// <summary>
    /// 200 pathways sharing their minima (H2, H) in one study, each through its own saddle-point calculation of one TS species at a
    /// slightly different energy, so that every reaction's barrier differs and the shared species are met by every slice.
    /// </summary>
    private static UploadDraft ManyPathways(int count)
    {
        var d = H3System.Draft(reaction: "H exchange 0", tsLabel: "ts0");
        for (var i = 1; i < count; i++)
        {
            var modes = H3System.TsModes();
            d.Calculations.Add(H3System.Calc($"ts{i}", "TS", CalculationKind.SaddlePoint, H3System.Ts(), H3System.ETs + 1e-4 * i,
                [.. modes.Select(m => m.FrequencyCm1)], modes));
            d.Reactions.Add(new DraftReaction($"H exchange {i}", "invented test pathway",
            [
                new DraftState("H2 + H", StateKind.Minimum, [new DraftTerm("H2", 1), new DraftTerm("H", 1)], null, []),
                new DraftState("TS", StateKind.SaddlePoint, [new DraftTerm("TS", 1)], $"ts{i}", [(1, 2), (2, 3)]),
                new DraftState("H + H2", StateKind.Minimum, [new DraftTerm("H", 1), new DraftTerm("H2", 1)], null, []),
            ]));
        }
        return d;
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task DeriveAll_InSeveralSlices_GivesWhatOneDeriverGivesReactionByReaction_InTheInputOrder(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(ManyPathways(200), new UploadChoices(), "member");
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));
        await using var db = await ledger.DbAsync();
        var inputs = await DerivationInputs.LoadAsync(db, [stored.StudyId!.Value], null, CancellationToken.None);
        Assert.Equal(200, inputs.Reactions.Count);

        var one = new ReactionDeriver(ModelSettings.Default, inputs);
        var expected = inputs.Reactions.Select(one.Derive).ToList();
        var progress = new List<int>();
        var sliced = DerivationService.DeriveAll(ModelSettings.Default, inputs, (done, _) => { lock (progress) progress.Add(done); }, CancellationToken.None, slices: 4);

        Assert.Equal(expected.Select(e => e.ReactionId), sliced.Select(s => s.ReactionId));
        foreach (var (e, s) in expected.Zip(sliced))
        {
            Assert.Equal(e.BarrierGibbsHartree, s.BarrierGibbsHartree);
            Assert.Equal(e.RateConstantPerSecond, s.RateConstantPerSecond);
            Assert.Equal(e.InputFingerprint, s.InputFingerprint);
            Assert.Equal(e.StatesJson, s.StatesJson);
            Assert.Equal(e.StepsJson, s.StepsJson);
            Assert.Equal(e.ConsistencyJson, s.ConsistencyJson);
        }
        // The saddle-point energies differ, so do the barriers: the comparison is not between copies of one number.
        Assert.Equal(200, expected.Select(e => e.BarrierElectronicHartree).Distinct().Count());
        // Progress only moves forward and ends at the whole.
        Assert.Equal(progress.Order(), progress);
        Assert.Equal(200, progress[^1]);
    }
}
