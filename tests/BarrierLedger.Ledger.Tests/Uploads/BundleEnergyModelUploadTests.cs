using System.Text;
using System.Text.Json.Nodes;
using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Uploads;

/// <summary>A bundle's <c>study.energy_model</c>: taken by the study an upload creates, before anything is derived; ignored (with a warning) by a study that exists.</summary>
public sealed class BundleEnergyModelUploadTests
{
    private const string Loader = "loader";

    /// <summary>The H3 test bundle with a study energy model: 350 K, 1 bar, low-mode entropy at 80 cm⁻¹, no tunnelling, lowest conformer.</summary>
    private static byte[] ManifestWithModel(string study = "Hydrogen exchange (bundle test)")
    {
        var n = JsonNode.Parse(H3Bundle.Manifest(study))!;
        n["study"]!["energy_model"] = new JsonObject
        {
            ["energies_from"] = "", ["thermal_from"] = "", ["temperature_kelvin"] = 350.0, ["standard_state"] = "1 bar",
            ["low_modes"] = "entropy", ["low_mode_cutoff_cm1"] = 80.0, ["tunnelling"] = "none", ["conformers"] = "lowest",
        };
        return Encoding.UTF8.GetBytes(n.ToJsonString());
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ImportBundle_CreatingTheStudy_TakesTheBundlesModelAuditedAndDerivesUnderIt(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var outcome = await ledger.Get<UploadService>().ImportBundleAsync(new MemoryStream(ManifestWithModel()), "h3.json", Loader);
        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        Assert.DoesNotContain(outcome.Issues, i => i.JsonPath == "$.study.energy_model");

        var view = await ledger.Get<EnergyModelService>().GetForStudyAsync(outcome.StudyId!.Value);
        Assert.True(view.IsOverride);
        var m = view.Settings;
        Assert.Equal(("", "", 350.0, StandardState.Gas1Bar, ThermoTreatment.QuasiRrhoEntropy, 80.0, TunnellingCorrection.None, ConformerChoice.Lowest),
            (m.EnergyLevel, m.ThermalLevel, m.TemperatureKelvin, m.StandardState, m.Treatment, m.QuasiRrhoCutoffCm1, m.Tunnelling, m.Conformers));

        await using var db = await ledger.DbAsync();
        var audit = await db.AuditEvents.OrderBy(a => a.Id).Select(a => new { a.Action, a.Summary }).ToListAsync();
        var saved = audit.FindIndex(a => a.Action == "energy-model.override-saved");
        Assert.True(saved >= 0, string.Join(", ", audit.Select(a => a.Action)));
        Assert.Contains("350 K", audit[saved].Summary);
        Assert.True(saved < audit.FindIndex(a => a.Action == "upload.stored"), "the model is set before the upload's records are written and derived");

        // The stored derivation was made under the bundle's model (not the group default, 298.15 K) in the upload itself.
        var d = await db.ReactionDerivations.SingleAsync();
        Assert.Equal(m.Fingerprint, d.ModelFingerprint);
        Assert.Equal(350.0, d.TemperatureKelvin);
        // Eyring (H. Eyring, J. Chem. Phys. 3, 107 (1935)): k = (k_B T / h) exp(−ΔG‡ / k_B T), with CODATA 2018 exact k_B and h
        // and 1 Eh = 4.3597447222071e-18 J, at the bundle's 350 K.
        const double kB = 1.380649e-23, h = 6.62607015e-34, hartreeJ = 4.3597447222071e-18;
        var expected = kB * 350.0 / h * Math.Exp(-d.BarrierGibbsHartree!.Value * hartreeJ / (kB * 350.0));
        Assert.Equal(expected, d.RateConstantPerSecond!.Value, expected * 1e-9);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ImportBundle_IntoAStudyThatExists_KeepsTheStudysModelAndWarns(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var uploads = ledger.Get<UploadService>();
        // The study is created without a model of its own (group default, 298.15 K) by a bundle without energy_model.
        var first = await uploads.ImportBundleAsync(new MemoryStream(Encoding.UTF8.GetBytes(H3Bundle.Manifest())), "h3.json", Loader);
        Assert.True(first.Stored, string.Join("\n", first.Errors));
        var models = ledger.Get<EnergyModelService>();
        var before = await models.GetForStudyAsync(first.StudyId!.Value);
        Assert.False(before.IsOverride);

        // The same study name again, now with a model: the preview and the upload warn at the key, the study keeps its model.
        var again = new UploadFile("h3-again.json", ManifestWithModel());
        var preview = await uploads.PreviewAsync([again], new UploadChoices());
        var warning = Assert.Single(preview.Issues, i => i.JsonPath == "$.study.energy_model");
        Assert.False(warning.IsError);
        Assert.Contains("keeps its own energy model", warning.Message);
        var second = await uploads.StoreAsync([again], new UploadChoices(), Loader);
        Assert.True(second.Stored, string.Join("\n", second.Errors));
        Assert.Equal(first.StudyId, second.StudyId);
        Assert.Contains(second.Issues, i => i.JsonPath == "$.study.energy_model" && !i.IsError);

        var after = await models.GetForStudyAsync(first.StudyId.Value);
        Assert.False(after.IsOverride);
        Assert.Equal(before.Settings, after.Settings);
        await using var db = await ledger.DbAsync();
        Assert.DoesNotContain(await db.AuditEvents.Select(a => a.Action).ToListAsync(), a => a == "energy-model.override-saved");
        Assert.Equal(before.Settings.Fingerprint, (await db.ReactionDerivations.SingleAsync()).ModelFingerprint);
    }
}
