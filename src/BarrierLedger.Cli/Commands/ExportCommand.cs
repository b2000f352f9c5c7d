using System.CommandLine;
using System.Globalization;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Uploads;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger export table|diagram|coordinates|examples</c>: manuscript files from a ledger (<c>--data-dir</c>) or straight
/// from a bundle folder (<c>--bundle</c>, stored into a temporary ledger first). Every table and figure states the energy model,
/// marks unverified or inconsistent rows with a footnote, and carries the caution.
/// </summary>
internal static class ExportCommand
{
    public static Command Create(CliContext ctx)
    {
        var command = new Command("export", "Write barrier tables (CSV, XLSX, LaTeX, Markdown), energy diagrams (SVG, PNG) and supporting-information coordinates.");
        command.Subcommands.Add(Table(ctx));
        command.Subcommands.Add(Diagram(ctx));
        command.Subcommands.Add(Coordinates(ctx));
        command.Subcommands.Add(Examples(ctx));
        return command;
    }

    private static Command Table(CliContext ctx)
    {
        var src = new SourceOptions();
        var study = StudyOption();
        var format = new Option<string>("--format") { Description = "csv, xlsx, latex or markdown", DefaultValueFactory = _ => "csv" };
        format.AcceptOnlyFromAmong("csv", "xlsx", "latex", "markdown");
        var reactions = new Option<string?>("--reactions") { Description = "Comma-separated reaction labels or ids (default: all of the study)" };
        var columns = new Option<string?>("--columns")
        {
            Description = "Comma-separated columns from: " + string.Join(", ", ColumnNames.Keys) + " (default: " + string.Join(",", TableOptions.DefaultColumns.Select(ColumnName)) + ")",
        };
        var unit = UnitOption();
        var decimals = DecimalsOption();
        var output = new Option<string>("--out") { Description = "File to write", Required = true };
        var cmd = new Command("table", "A barrier table of a study.") { study, format, reactions, columns, unit, decimals, output };
        src.AddTo(cmd);
        cmd.SetAction(pr => src.Run(ctx, pr, async (services, ct) =>
        {
            var studyId = await ResolveStudyAsync(services, pr.GetValue(study), ct);
            var ids = await ResolveReactionsAsync(services, studyId, pr.GetValue(reactions), ct);
            var options = new TableOptions(ParseColumns(pr.GetValue(columns), ctx.Err), ParseUnit(pr.GetValue(unit)), pr.GetValue(decimals));
            var file = await services.GetRequiredService<ExportService>().TableAsync(studyId, ids, ParseFormat(pr.GetValue(format)!), options, ct);
            Write(ctx, pr.GetValue(output)!, file.Content);
            return ExitCodes.Ok;
        }));
        return cmd;
    }

    private static Command Diagram(CliContext ctx)
    {
        var src = new SourceOptions();
        var study = StudyOption();
        var reaction = new Option<string>("--reaction") { Description = "Reaction label or id", Required = true };
        var quantity = new Option<string>("--quantity") { Description = "G, H or E (ΔG, ΔH or ΔE)", DefaultValueFactory = _ => "G" };
        quantity.AcceptOnlyFromAmong("G", "H", "E");
        var unit = UnitOption();
        var decimals = DecimalsOption();
        var output = new Option<string>("--out") { Description = "SVG file to write; the PNG goes beside it (same name, .png)", Required = true };
        var cmd = new Command("diagram", "The energy diagram of one reaction as SVG and PNG (same look as the Reaction screen).") { study, reaction, quantity, unit, decimals, output };
        src.AddTo(cmd);
        cmd.SetAction(pr => src.Run(ctx, pr, async (services, ct) =>
        {
            var studyId = await ResolveStudyAsync(services, pr.GetValue(study), ct);
            var id = (await ResolveReactionsAsync(services, studyId, pr.GetValue(reaction), ct))!.Single();
            var (svg, png) = await services.GetRequiredService<ExportService>().DiagramAsync(id, "Δ" + pr.GetValue(quantity), ParseUnit(pr.GetValue(unit)), pr.GetValue(decimals), ct);
            var path = pr.GetValue(output)!;
            Write(ctx, path, svg.Content);
            Write(ctx, Path.ChangeExtension(path, ".png"), png.Content);
            return ExitCodes.Ok;
        }));
        return cmd;
    }

    private static Command Coordinates(CliContext ctx)
    {
        var src = new SourceOptions();
        var study = StudyOption();
        var output = new Option<string>("--out") { Description = "Text file to write", Required = true };
        var zip = new Option<string?>("--zip") { Description = "Also write a zip with one .xyz per structure" };
        var cmd = new Command("coordinates", "Supporting-information coordinates: every structure's level of theory, energies, imaginary frequencies and XYZ block.") { study, output, zip };
        src.AddTo(cmd);
        cmd.SetAction(pr => src.Run(ctx, pr, async (services, ct) =>
        {
            var studyId = await ResolveStudyAsync(services, pr.GetValue(study), ct);
            var export = services.GetRequiredService<ExportService>();
            Write(ctx, pr.GetValue(output)!, (await export.SupportingInfoTextAsync(studyId, ct)).Content);
            if (pr.GetValue(zip) is { } z) Write(ctx, z, (await export.SupportingInfoZipAsync(studyId, ct)).Content);
            return ExitCodes.Ok;
        }));
        return cmd;
    }

    private static Command Examples(CliContext ctx)
    {
        var src = new SourceOptions();
        var study = StudyOption();
        var reaction = new Option<string?>("--reaction") { Description = "Reaction for the diagram (default: the consistent reaction with the most steps)" };
        var output = new Option<string>("--out") { Description = "Folder to write into", Required = true };
        var cmd = new Command("examples", "One table in each format, one diagram (SVG and PNG) and the coordinates of a study, into one folder.") { study, reaction, output };
        src.AddTo(cmd);
        cmd.SetAction(pr => src.Run(ctx, pr, async (services, ct) =>
        {
            var studyId = await ResolveStudyAsync(services, pr.GetValue(study), ct);
            var export = services.GetRequiredService<ExportService>();
            var dir = pr.GetValue(output)!;
            Directory.CreateDirectory(dir);
            var options = new TableOptions(Enum.GetValues<ExportColumn>().Where(c => c != ExportColumn.LevelOfTheory).ToList());
            foreach (var f in Enum.GetValues<TableFormat>())
            {
                var file = await export.TableAsync(studyId, null, f, options, ct);
                Write(ctx, Path.Combine(dir, "barriers" + Path.GetExtension(file.FileName)), file.Content);
            }
            int reactionId;
            if (pr.GetValue(reaction) is { } r) reactionId = (await ResolveReactionsAsync(services, studyId, r, ct))!.Single();
            else reactionId = await DefaultDiagramReactionAsync(services, studyId, ct);
            var (svg, png) = await export.DiagramAsync(reactionId, "ΔG", EnergyUnit.KcalPerMol, 1, ct);
            Write(ctx, Path.Combine(dir, "diagram.svg"), svg.Content);
            Write(ctx, Path.Combine(dir, "diagram.png"), png.Content);
            Write(ctx, Path.Combine(dir, "coordinates.txt"), (await export.SupportingInfoTextAsync(studyId, ct)).Content);
            return ExitCodes.Ok;
        }));
        return cmd;
    }

    private static async Task<int> DefaultDiagramReactionAsync(IServiceProvider services, int studyId, CancellationToken ct)
    {
        var query = services.GetRequiredService<ExportQueryService>();
        var table = await query.GetTableSourceAsync(studyId, null, ct);
        var study = (await query.ListStudiesAsync(ct)).Single(s => s.Id == studyId);
        // A reaction whose rows are all consistent, with the most steps: the figure then shows the pathway, not a warning.
        var best = table.Rows.GroupBy(r => r.Reaction).Where(g => g.All(r => r.IsConsistent)).OrderByDescending(g => g.Count()).Select(g => g.Key).FirstOrDefault();
        var pick = study.Reactions.FirstOrDefault(r => r.Label == best && r.HasDerivedValues) ?? study.Reactions.FirstOrDefault(r => r.HasDerivedValues)
            ?? throw new UsageException("No reaction of the study has derived values to draw.");
        return pick.Id;
    }

    internal static readonly IReadOnlyDictionary<string, ExportColumn> ColumnNames = new Dictionary<string, ExportColumn>(StringComparer.OrdinalIgnoreCase)
    {
        ["reaction"] = ExportColumn.Reaction,
        ["step"] = ExportColumn.Step,
        ["barrier-dE"] = ExportColumn.BarrierElectronic,
        ["barrier-dH"] = ExportColumn.BarrierEnthalpy,
        ["barrier-dG"] = ExportColumn.BarrierGibbs,
        ["reaction-dG"] = ExportColumn.ReactionGibbs,
        ["k"] = ExportColumn.RateConstant,
        ["half-life"] = ExportColumn.HalfLife,
        ["imaginary"] = ExportColumn.ImaginaryFrequency,
        ["check"] = ExportColumn.Verdict,
        ["review"] = ExportColumn.ReviewStatus,
        ["level"] = ExportColumn.LevelOfTheory,
    };

    /// <summary>
    /// The first column names, where "dG" (a barrier) beside "dGr" (a reaction energy) read alike: still accepted for one
    /// release, with a deprecation line on stderr.
    /// </summary>
    internal static readonly IReadOnlyDictionary<string, string> DeprecatedColumnNames = new Dictionary<string, string>(StringComparer.OrdinalIgnoreCase)
    {
        ["dE"] = "barrier-dE",
        ["dH"] = "barrier-dH",
        ["dG"] = "barrier-dG",
        ["dGr"] = "reaction-dG",
    };

    private static string ColumnName(ExportColumn c) => ColumnNames.First(kv => kv.Value == c).Key;

    private static IReadOnlyList<ExportColumn> ParseColumns(string? text, TextWriter err)
    {
        if (string.IsNullOrWhiteSpace(text)) return TableOptions.DefaultColumns;
        var list = new List<ExportColumn>();
        foreach (var given in text.Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries))
        {
            var t = given;
            if (DeprecatedColumnNames.TryGetValue(t, out var renamed))
            {
                err.WriteLine($"barrierledger: --columns '{t}' is deprecated and will be removed in the next release; use '{renamed}'");
                t = renamed;
            }
            if (!ColumnNames.TryGetValue(t, out var c)) throw new UsageException($"--columns: unknown column '{t}'; choose from {string.Join(", ", ColumnNames.Keys)}");
            if (list.Contains(c)) throw new UsageException($"--columns: '{t}' is listed twice");
            list.Add(c);
        }
        return list;
    }

    private static EnergyUnit ParseUnit(string? text) =>
        BarrierUnits.TryParse(text, out var u, out var why) ? u : throw new UsageException($"--unit: {why}");

    private static TableFormat ParseFormat(string text) => text switch
    {
        "xlsx" => TableFormat.Xlsx,
        "latex" => TableFormat.Latex,
        "markdown" => TableFormat.Markdown,
        _ => TableFormat.Csv,
    };

    private static Option<string?> StudyOption() => new("--study") { Description = "Study name or id (default: the only study)" };

    private static Option<string> UnitOption() => new("--unit") { Description = BarrierUnits.Expected, DefaultValueFactory = _ => "kcal/mol" };

    private static Option<int> DecimalsOption()
    {
        var o = new Option<int>("--decimals") { Description = "Decimals of energies (rounding happens only in the file)", DefaultValueFactory = _ => 1 };
        o.Validators.Add(r =>
        {
            if (r.Tokens.Count == 1 && int.TryParse(r.Tokens[0].Value, NumberStyles.Integer, CultureInfo.InvariantCulture, out var n) && n is < 0 or > 6)
                r.AddError($"--decimals must be between 0 and 6, got {n}");
        });
        return o;
    }

    private static void Write(CliContext ctx, string path, byte[] content) => Write(ctx.Out, path, content);

    /// <summary>Writes a file (creating its folder) and says so on <paramref name="log"/>.</summary>
    internal static void Write(TextWriter log, string path, byte[] content)
    {
        var full = Path.GetFullPath(path);
        if (Path.GetDirectoryName(full) is { } d) Directory.CreateDirectory(d);
        File.WriteAllBytes(full, content);
        log.WriteLine($"wrote {path} ({content.Length} bytes)");
    }

    internal static async Task<int> ResolveStudyAsync(IServiceProvider services, string? text, CancellationToken ct)
    {
        var studies = await services.GetRequiredService<ExportQueryService>().ListStudiesAsync(ct);
        if (studies.Count == 0) throw new UsageException("The ledger holds no study.");
        if (string.IsNullOrWhiteSpace(text))
            return studies.Count == 1 ? studies[0].Id : throw new UsageException($"The ledger holds {studies.Count} studies; choose one with --study: {string.Join("; ", studies.Select(s => $"{s.Id} \"{s.Name}\""))}");
        var match = studies.FirstOrDefault(s => s.Name.Equals(text, StringComparison.OrdinalIgnoreCase))
            ?? (int.TryParse(text, NumberStyles.Integer, CultureInfo.InvariantCulture, out var id) ? studies.FirstOrDefault(s => s.Id == id) : null);
        return match?.Id ?? throw new UsageException($"--study: no study named or numbered '{text}'; there are: {string.Join("; ", studies.Select(s => $"{s.Id} \"{s.Name}\""))}");
    }

    internal static async Task<IReadOnlyCollection<int>?> ResolveReactionsAsync(IServiceProvider services, int studyId, string? text, CancellationToken ct)
    {
        if (string.IsNullOrWhiteSpace(text)) return null;
        var study = (await services.GetRequiredService<ExportQueryService>().ListStudiesAsync(ct)).Single(s => s.Id == studyId);
        var ids = new List<int>();
        foreach (var t in text.Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries))
        {
            var r = study.Reactions.FirstOrDefault(x => x.Label.Equals(t, StringComparison.OrdinalIgnoreCase))
                ?? (int.TryParse(t, NumberStyles.Integer, CultureInfo.InvariantCulture, out var id) ? study.Reactions.FirstOrDefault(x => x.Id == id) : null)
                ?? throw new UsageException($"no reaction '{t}' in study \"{study.Name}\"; there are: {string.Join(", ", study.Reactions.Select(x => x.Label))}");
            ids.Add(r.Id);
        }
        return ids;
    }
}

/// <summary>Where the exported numbers come from: an existing ledger folder, or a bundle stored into a temporary ledger.</summary>
internal sealed class SourceOptions
{
    /// <summary>Input formats only (a folder's README or notes are not part of the upload).</summary>
    private static bool IsDataFile(string path) => Path.GetExtension(path).ToLowerInvariant() is ".json" or ".xyz" or ".extxyz" or ".csv" or ".zip";

    public Option<string?> DataDir { get; } = new("--data-dir") { Description = "Ledger data folder (holds barrierledger.db); default ./data" };
    public Option<string?> Bundle { get; } = new("--bundle") { Description = "Export from a bundle instead (a folder with bundle.json, a bundle .json or .zip), stored first into a temporary ledger" };

    public void AddTo(Command command)
    {
        command.Options.Add(DataDir);
        command.Options.Add(Bundle);
    }

    public int Run(CliContext ctx, ParseResult pr, Func<IServiceProvider, CancellationToken, Task<int>> action) =>
        RunAsync(ctx, pr, action).GetAwaiter().GetResult();

    private async Task<int> RunAsync(CliContext ctx, ParseResult pr, Func<IServiceProvider, CancellationToken, Task<int>> action)
    {
        var bundle = pr.GetValue(Bundle);
        var dataDir = pr.GetValue(DataDir);
        if (bundle is not null && dataDir is not null) throw new UsageException("give either --data-dir or --bundle, not both");
        string dir;
        string? temp = null;
        if (bundle is not null)
        {
            temp = Directory.CreateTempSubdirectory("bl-export-").FullName;
            dir = temp;
        }
        else
        {
            dir = Path.GetFullPath(dataDir ?? "data");
            var options = new LedgerOptions { DataDirectory = dir };
            if (!File.Exists(options.DatabasePath))
            {
                ctx.Err.WriteLine($"barrierledger: there is no ledger at {options.DatabasePath} (use --data-dir, or --bundle to export from files)");
                return ExitCodes.Unreadable;
            }
        }
        try
        {
            await using var services = LedgerHost.Build(dir).AddLedgerExports().BuildServiceProvider();
            var ledgerOptions = services.GetRequiredService<LedgerOptions>();
            await LedgerDatabase.PrepareAsync(ledgerOptions, services.GetRequiredService<IDbContextFactory<LedgerDbContext>>());
            if (bundle is not null && !await LoadBundleAsync(ctx, services, bundle)) return ExitCodes.Unreadable;
            try
            {
                return await action(services, CancellationToken.None);
            }
            catch (ArgumentException ex)
            {
                ctx.Err.WriteLine($"barrierledger: {ex.Message}");
                return ExitCodes.Unreadable;
            }
            catch (InvalidOperationException ex) when (ex is not ObjectDisposedException)
            {
                ctx.Err.WriteLine($"barrierledger: {ex.Message}");
                return ExitCodes.Unreadable;
            }
        }
        finally
        {
            SqliteConnection.ClearAllPools();
            if (temp is not null) try { Directory.Delete(temp, true); } catch (IOException) { }
        }
    }

    private static async Task<bool> LoadBundleAsync(CliContext ctx, IServiceProvider services, string path)
    {
        List<UploadFile> files;
        if (Directory.Exists(path))
        {
            var root = Path.GetFullPath(path);
            files = [.. Directory.EnumerateFiles(root, "*", SearchOption.AllDirectories).Where(IsDataFile).Order(StringComparer.Ordinal)
                .Select(p => new UploadFile(Path.GetRelativePath(root, p).Replace('\\', '/'), File.ReadAllBytes(p)))];
        }
        else if (File.Exists(path))
        {
            var root = Path.GetDirectoryName(Path.GetFullPath(path))!;
            files = [new UploadFile(Path.GetFileName(path), File.ReadAllBytes(path))];
            if (path.EndsWith(".json", StringComparison.OrdinalIgnoreCase))
                files.AddRange(Directory.EnumerateFiles(root, "*", SearchOption.AllDirectories).Where(p => Path.GetFullPath(p) != Path.GetFullPath(path) && IsDataFile(p)).Order(StringComparer.Ordinal)
                    .Select(p => new UploadFile(Path.GetRelativePath(root, p).Replace('\\', '/'), File.ReadAllBytes(p))));
        }
        else
        {
            ctx.Err.WriteLine($"barrierledger: --bundle: {path} does not exist");
            return false;
        }
        var outcome = await services.GetRequiredService<UploadService>().StoreAsync(files, new UploadChoices(), "barrierledger-cli");
        foreach (var i in outcome.Issues) ctx.Err.WriteLine(i.ToString());
        if (!outcome.Stored) ctx.Err.WriteLine($"barrierledger: the bundle {path} could not be stored (issues above)");
        return outcome.Stored;
    }
}

/// <summary>The ledger services on a data folder, as the web app wires them.</summary>
internal static class LedgerHost
{
    public static IServiceCollection Build(string dataDirectory)
    {
        var config = new ConfigurationBuilder()
            .AddInMemoryCollection(new Dictionary<string, string?> { [$"{LedgerOptions.SectionName}:DataDirectory"] = dataDirectory })
            .Build();
        return new ServiceCollection().AddLedger(config);
    }
}
