using System.Net;
using System.Net.Http.Json;
using System.Text;
using System.Text.Json;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Conformers;
using BarrierLedger.Ledger.Accounts;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Web.Tests.Endpoints;

/// <summary>
/// Conformers through the HTTP API (issue 21, item 1: "the API and push accept them too"): the <c>conformerPerFile</c> and
/// <c>conformer</c> fields label what is stored, and the reply's <c>conformers</c> names duplicates and mirror images. The structures
/// are butane built from internal coordinates (FlexibleMolecules; bond lengths and angles from memory), so the marks are known by
/// construction: a rotated and moved copy has RMSD 0 (rigid motion, analytic) and gauche +65° / −65° are mirror images (reflection,
/// analytic). Energies are invented.
/// </summary>
public sealed class ConformerUploadApiTests
{
    private static byte[] Xyz(Molecule m, double energy) => Encoding.UTF8.GetBytes(XyzWriter.ToExtendedText(m, energy));

    /// <summary>The same structure turned 90° about z and moved.</summary>
    private static Molecule Moved(Molecule m) =>
        new(m.Elements, [.. m.PositionsAngstrom.Select(p => new Vec3(-p.Y + 3.0, p.X - 1.0, p.Z + 2.0))], m.Charge, m.Multiplicity);

    private static Dictionary<string, string> ButaneChoices() => new()
    {
        ["study"] = "API conformers", ["species"] = "butane", ["kind"] = "Minimum", ["level"] = ApiFiles.Level, ["charge"] = "0", ["multiplicity"] = "1",
    };

    [Fact]
    public async Task ConformerPerFile_EachFileIsTheConformerOfItsName_AndTheReplyNamesTheDuplicateAndTheMirrorPair()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var anti = FlexibleMolecules.Butane(180);
        var fields = ButaneChoices();
        fields["conformerPerFile"] = "true";

        var response = await client.PostAsync("/api/v1/uploads", ApiFiles.Form(
        [
            ("anti.xyz", Xyz(anti, -158.4000)), ("gauche-plus.xyz", Xyz(FlexibleMolecules.Butane(65), -158.3985)),
            ("gauche-minus.xyz", Xyz(FlexibleMolecules.Butane(-65), -158.3985)), ("anti-again.xyz", Xyz(Moved(anti), -158.4000)),
        ], fields));

        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        var body = await response.Content.ReadFromJsonAsync<JsonElement>();
        var notes = body.GetProperty("conformers").EnumerateArray().Select(n => n.GetString()!).ToList();
        Assert.Contains(notes, n => n.StartsWith("species butane: conformer anti-again duplicates anti (RMSD 0.000 Å", StringComparison.Ordinal));
        Assert.Contains(notes, n => n.StartsWith("species butane: conformers gauche-plus and gauche-minus are mirror images", StringComparison.Ordinal));
        Assert.DoesNotContain(notes, n => n.Contains("anti and gauche", StringComparison.Ordinal) || n.Contains("gauche-plus duplicates", StringComparison.Ordinal));
        await using var db = await host.DbAsync();
        Assert.Equal(["anti", "gauche-plus", "gauche-minus", "anti-again"], await db.Calculations.OrderBy(c => c.Id).Select(c => c.Conformer).ToListAsync());
        Assert.Equal(1, await db.Species.CountAsync(s => s.Label == "butane"));
    }

    [Fact]
    public async Task ConformerField_LabelsTheFile_AndAMultiFrameSinglePointIsOneConformerPerFrame()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var one = ButaneChoices();
        one["conformer"] = "g+";
        Assert.Equal(HttpStatusCode.Created, (await client.PostAsync("/api/v1/uploads", ApiFiles.Form([("b.xyz", Xyz(FlexibleMolecules.Butane(65), -158.3985))], one))).StatusCode);

        var frames = ButaneChoices();
        frames["kind"] = "SinglePoint";
        var text = Encoding.UTF8.GetString(Xyz(FlexibleMolecules.Butane(180), -158.9000)) + Encoding.UTF8.GetString(Xyz(FlexibleMolecules.Butane(-65), -158.8980));
        Assert.Equal(HttpStatusCode.Created, (await client.PostAsync("/api/v1/uploads", ApiFiles.Form([("frames.xyz", Encoding.UTF8.GetBytes(text))], frames))).StatusCode);

        await using var db = await host.DbAsync();
        var stored = await db.Calculations.OrderBy(c => c.Id).Select(c => new { c.Conformer, c.Kind }).ToListAsync();
        Assert.Equal(["g+", "c1", "c2"], stored.Select(c => c.Conformer));
        Assert.Equal([CalculationKind.Minimum, CalculationKind.SinglePoint, CalculationKind.SinglePoint], stored.Select(c => c.Kind));
    }
}
