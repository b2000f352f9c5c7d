using BarrierLedger.Core.Formats;
using BarrierLedger.Core.IsotopeEffects;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.IsotopeEffects;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Export;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;

namespace BarrierLedger.Ledger.Tests.IsotopeEffects;

public sealed class IsotopeEffectServiceTests
{
    // The demo's KE step breaks C2–H4. A set "4=D" is matched to acetaldehyde by atom order, stored and audited, and its KIE is exactly
    // what Core's one entry point gives for the committed structure files under the same model: the ledger adds no rule of its own.
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task CreateByAtomOrder_StoresAuditsAndGivesCoresKie_ThenRetires(StoreProvider store)
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync(store);
        await using var _ = ledger;
        var user = await ledger.AddUserAsync("kie-member", Roles.Member);
        var service = ledger.Get<IsotopeEffectService>();
        var ke = (await service.FindReactionAsync(studyId, "KE"))!.Value;

        var saved = await service.CreateAsync(ke, 1, "D at H4", "4=D", null, user);
        Assert.True(saved.Saved, string.Join("; ", saved.Errors));
        var report = (await service.GetForReactionAsync(ke))!;
        var effect = Assert.Single(report.Effects);
        Assert.Equal(IsotopeMapping.SameAtomOrder, effect.Set.Mapping);
        var r = Assert.Single(effect.Set.Reactants);
        Assert.Equal("acetaldehyde", r.SpeciesLabel);
        Assert.Equal("4=2H", string.Join(", ", r.Substitutions));
        Assert.Contains("H4→D", effect.PrimaryAtoms);
        Assert.Contains(effect.Cautions, c => c.Contains("not verified"));
        var kie = effect.Result ?? throw new Xunit.Sdk.XunitException($"no KIE: {effect.Unavailable}");

        var seed = DemoLedger.DemoFolder;
        QcSchemaResult Read(string name)
        {
            using var f = File.OpenRead(Path.Combine(seed, "structures", name));
            return QcSchemaReader.Read(f, name).Value!;
        }
        var ts = Read("ts-ke.json");
        var acetaldehyde = Read("acetaldehyde.json");
        var m = report.Model;
        var direct = KineticIsotopeEffect.Compute(
            new KieStructure("TS", ts.Molecule, [.. ts.HessianHartreePerBohr2], IsotopeSubstitution.ParseList("4=D")),
            [new KieStructure("acetaldehyde", acetaldehyde.Molecule, [.. acetaldehyde.HessianHartreePerBohr2], IsotopeSubstitution.ParseList("4=D"))],
            new KieOptions(m.TemperatureKelvin, m.Treatment, m.QuasiRrhoCutoffCm1,
                m.Tunnelling == TunnellingCorrection.Wigner ? KieTunnelling.Wigner : KieTunnelling.None));
        Assert.Equal(direct.Kie, kie.Kie, 12);
        Assert.InRange(kie.Kie, 2.0, 10.0);

        var events = await ledger.Get<AuditService>().GetEventsAsync(nameof(IsotopologueSet), saved.Id!.Value.ToString(System.Globalization.CultureInfo.InvariantCulture));
        Assert.Contains(events, e => e.Action == "isotopologue-set.created" && e.UserName == "kie-member");

        var retired = await service.SetRetiredAsync(saved.Id.Value, true, effect.Set.Version, user);
        Assert.True(retired.Saved, string.Join("; ", retired.Errors));
        Assert.Empty((await service.GetForReactionAsync(ke))!.Effects);
        Assert.True(Assert.Single((await service.GetForReactionAsync(ke, includeRetired: true))!.Effects).Set.Retired);
        Assert.False((await service.SetRetiredAsync(saved.Id.Value, false, effect.Set.Version, user)).Saved); // stale version
        Assert.Contains((await ledger.Get<AuditService>().GetEventsAsync(nameof(IsotopologueSet))), e => e.Action == "isotopologue-set.retired");
    }

    // IX's first saddle point holds the spectator fluoride as its own term, so its atoms cannot be matched to the reactant state by
    // order: the service asks instead of guessing, stores nothing, and accepts the atoms the member gives and confirms.
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Create_WhenAtomOrderDoesNotMatch_AsksForTheReactantAtoms_ThenStoresTheConfirmedOnes(StoreProvider store)
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync(store);
        await using var _ = ledger;
        var user = await ledger.AddUserAsync("kie-member", Roles.Member);
        var service = ledger.Get<IsotopeEffectService>();
        var ix = (await service.FindReactionAsync(studyId, "IX"))!.Value;

        var asked = await service.CreateAsync(ix, 1, "13C", "1=13C", null, user);
        Assert.False(asked.Saved);
        Assert.True(asked.NeedsReactantAtoms);
        Assert.Contains("by atom order", Assert.Single(asked.Errors));
        Assert.Empty((await service.GetForReactionAsync(ix))!.Effects);

        var wrong = await service.CreateAsync(ix, 1, "13C", "1=13C", "chloromethane: 2=13C", user);
        Assert.False(wrong.Saved);
        Assert.Contains(wrong.Errors, e => e.Contains("cannot become 13C"));

        var confirmed = await service.CreateAsync(ix, 1, "13C", "1=13C", "chloromethane: 1=13C", user);
        Assert.True(confirmed.Saved, string.Join("; ", confirmed.Errors));
        var effect = Assert.Single((await service.GetForReactionAsync(ix))!.Effects);
        Assert.Equal(IsotopeMapping.Confirmed, effect.Set.Mapping);
        Assert.Contains(effect.Cautions, c => c.Contains("confirmed by a member"));
        Assert.NotNull(effect.Result);
    }

    // A calculation with frequencies (or modes) but no Cartesian Hessian cannot give another isotopologue's frequencies: the set is
    // stored, but no number is offered, and the reason says which calculation lacks what.
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Compute_WithFrequenciesButNoHessian_OffersNoNumberAndSaysWhy(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var user = await ledger.AddUserAsync("kie-member", Roles.Member);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), user);
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));
        var service = ledger.Get<IsotopeEffectService>();
        var reaction = Assert.Single(stored.ReactionIds);
        var saved = await service.CreateAsync(reaction, 1, "D in the middle", "2=D", null, user);
        Assert.True(saved.Saved, string.Join("; ", saved.Errors));
        var effect = Assert.Single((await service.GetForReactionAsync(reaction))!.Effects);
        Assert.Null(effect.Result);
        Assert.Contains("but no Cartesian Hessian", effect.Unavailable);
    }
}
