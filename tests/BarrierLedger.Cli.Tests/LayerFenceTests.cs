using System.Reflection;
using System.Reflection.Emit;
using BarrierLedger.Cli.Commands;

namespace BarrierLedger.Cli.Tests;

/// <summary>
/// The layers of DEVELOPERS.md as a test: Core knows no store, no web and no command line; the demo generator knows only Core;
/// the Ledger knows no screens (and only the ASP.NET Core pieces it stores: Identity's EF store, data protection and their
/// cryptography); the command line reaches the Ledger only from the commands that work on a whole ledger (export, backup,
/// restore, migrate-store). Read from the built assemblies by reflection and from the CLI's method bodies (IL), so that a new
/// reference in any file fails here.
/// </summary>
public sealed class LayerFenceTests
{
    private static readonly Assembly Core = typeof(BarrierLedger.Core.Geometry.Molecule).Assembly;
    private static readonly Assembly Demo = typeof(BarrierLedger.Demo.DemoScenario).Assembly;
    private static readonly Assembly Ledger = typeof(BarrierLedger.Ledger.Storage.LedgerDbContext).Assembly;
    private static readonly Assembly Cli = typeof(ExportCommand).Assembly;

    /// <summary>
    /// The CLI commands that open a ledger (a store, or a bundle loaded into a temporary one). "KineticsCommand" simulates a
    /// bundle's pathways from the numbers the ledger's one derivation derives for it (issues 16 and 22), so it opens one too.
    /// </summary>
    internal static readonly HashSet<string> LedgerCommands =
    [
        nameof(ExportCommand), nameof(BackupCommand), nameof(RestoreCommand), nameof(MigrateStoreCommand), "KineticsCommand",
    ];

    /// <summary>The shared ledger opener of those commands (in ExportCommand.cs): using it counts as using the Ledger.</summary>
    internal static readonly HashSet<string> LedgerOpeners = ["SourceOptions", "LedgerHost"];

    private static IEnumerable<string> References(Assembly a) => a.GetReferencedAssemblies().Select(r => r.Name!);

    [Fact]
    public void Core_ReferencesNeitherTheStoreNorTheWebNorTheCommandLine()
    {
        var wrong = References(Core).Where(n => n.StartsWith("Microsoft.EntityFrameworkCore", StringComparison.Ordinal)
            || n.StartsWith("Microsoft.AspNetCore", StringComparison.Ordinal) || n.StartsWith("Microsoft.Data", StringComparison.Ordinal)
            || n.StartsWith("BarrierLedger.", StringComparison.Ordinal)).ToList();
        Assert.True(wrong.Count == 0, $"Core references {string.Join(", ", wrong)}");
    }

    [Fact]
    public void Demo_ReferencesOnlyCoreOfOurs()
    {
        var ours = References(Demo).Where(n => n.StartsWith("BarrierLedger.", StringComparison.Ordinal)).ToList();
        Assert.Equal(["BarrierLedger.Core"], ours);
        Assert.DoesNotContain(References(Demo), n => n.StartsWith("Microsoft.EntityFrameworkCore", StringComparison.Ordinal) || n.StartsWith("Microsoft.AspNetCore", StringComparison.Ordinal));
    }

    /// <summary>ASP.NET Core assemblies the Ledger may use: Identity's EF store, data protection and the hashing they need.</summary>
    private static readonly string[] LedgerAspNetAllowed =
    [
        "Microsoft.AspNetCore.Identity.EntityFrameworkCore", "Microsoft.AspNetCore.DataProtection", "Microsoft.AspNetCore.Cryptography",
    ];

    [Fact]
    public void Ledger_ReferencesNoScreensAndOnlyTheAspNetPiecesItStores()
    {
        var refs = References(Ledger).ToList();
        Assert.DoesNotContain(refs, n => n is "BarrierLedger.Web" or "BarrierLedger.Cli");
        var wrong = refs.Where(n => n.StartsWith("Microsoft.AspNetCore", StringComparison.Ordinal)
            && !LedgerAspNetAllowed.Any(ok => n.StartsWith(ok, StringComparison.Ordinal))).ToList();
        Assert.True(wrong.Count == 0, $"the Ledger references {string.Join(", ", wrong)}; it may use only {string.Join(", ", LedgerAspNetAllowed)}");
    }

    [Fact]
    public void CommandLine_ReachesTheLedgerOnlyFromTheCommandsThatOpenALedger()
    {
        var offenders = new SortedSet<string>(StringComparer.Ordinal);
        foreach (var type in Cli.GetTypes())
        {
            var home = Outermost(type);
            if (LedgerCommands.Contains(home.Name)) continue;
            var opener = LedgerOpeners.Contains(home.Name);
            foreach (var used in TypesUsedBy(type))
            {
                if (!opener && used.Assembly == Ledger) offenders.Add($"{home.FullName} uses {used.FullName}");
                if (!opener && used.Assembly == Cli && LedgerOpeners.Contains(Outermost(used).Name)) offenders.Add($"{home.FullName} opens a ledger through {used.Name}");
            }
        }
        Assert.True(offenders.Count == 0, "the command line uses the Ledger outside " + string.Join(", ", LedgerCommands) + ":\n" + string.Join("\n", offenders));
    }

    // The scanner itself must see a use of the Ledger in a method body; otherwise the test above could not fail.
    [Fact]
    public void Scanner_SeesALedgerTypeUsedInsideAMethodBody()
    {
        var used = TypesUsedBy(typeof(ExportCommand)).Concat(typeof(ExportCommand).GetNestedTypes(All).SelectMany(TypesUsedBy)).ToList();
        Assert.Contains(used, t => t.Assembly == Ledger);
        Assert.DoesNotContain(TypesUsedBy(typeof(ThermoCommand)), t => t.Assembly == Ledger);
    }

    private const BindingFlags All = BindingFlags.Public | BindingFlags.NonPublic | BindingFlags.Instance | BindingFlags.Static | BindingFlags.DeclaredOnly;

    private static Type Outermost(Type t)
    {
        while (t.DeclaringType is { } d) t = d;
        return t;
    }

    /// <summary>Types in a type's shape (base, interfaces, fields, signatures) and in its method bodies (every type, method and field token of the IL).</summary>
    internal static IEnumerable<Type> TypesUsedBy(Type type)
    {
        var found = new HashSet<Type>();
        void Add(Type? t)
        {
            if (t is null || !found.Add(t)) return;
            if (t.HasElementType) Add(t.GetElementType());
            if (t.IsGenericType) foreach (var a in t.GetGenericArguments()) Add(a);
        }
        Add(type.BaseType);
        foreach (var i in type.GetInterfaces()) Add(i);
        foreach (var f in type.GetFields(All)) Add(f.FieldType);
        foreach (var p in type.GetProperties(All)) Add(p.PropertyType);
        var methods = type.GetMethods(All).Cast<MethodBase>().Concat(type.GetConstructors(All));
        foreach (var m in methods)
        {
            if (m is MethodInfo mi) Add(mi.ReturnType);
            foreach (var p in m.GetParameters()) Add(p.ParameterType);
            MethodBody? body;
            try { body = m.GetMethodBody(); } catch (InvalidOperationException) { continue; }
            if (body is null) continue;
            foreach (var l in body.LocalVariables) Add(l.LocalType);
            foreach (var member in Tokens(m, body.GetILAsByteArray() ?? []))
            {
                switch (member)
                {
                    case Type t: Add(t); break;
                    case MethodBase mb: Add(mb.DeclaringType); if (mb is MethodInfo r) Add(r.ReturnType); foreach (var p in mb.GetParameters()) Add(p.ParameterType); break;
                    case FieldInfo fi: Add(fi.DeclaringType); Add(fi.FieldType); break;
                }
            }
        }
        return found;
    }

    private static readonly Dictionary<short, OpCode> s_opCodes = typeof(OpCodes).GetFields(BindingFlags.Public | BindingFlags.Static)
        .Select(f => (OpCode)f.GetValue(null)!).ToDictionary(o => o.Value);

    /// <summary>The members named by the metadata tokens of a method's IL (types, methods, fields).</summary>
    private static IEnumerable<MemberInfo> Tokens(MethodBase method, byte[] il)
    {
        var typeArgs = method.DeclaringType is { IsGenericType: true } d ? d.GetGenericArguments() : null;
        var methodArgs = method.IsGenericMethod ? method.GetGenericArguments() : null;
        for (var i = 0; i < il.Length;)
        {
            short value = il[i++];
            if (value == 0xFE) value = unchecked((short)(0xFE00 | il[i++]));
            if (!s_opCodes.TryGetValue(value, out var op)) yield break; // not IL we understand: stop rather than misread
            switch (op.OperandType)
            {
                case OperandType.InlineMethod or OperandType.InlineField or OperandType.InlineType or OperandType.InlineTok:
                    var token = BitConverter.ToInt32(il, i);
                    MemberInfo? member = null;
                    try { member = method.Module.ResolveMember(token, typeArgs, methodArgs); } catch (ArgumentException) { } catch (TypeLoadException) { }
                    if (member is not null) yield return member;
                    i += 4;
                    break;
                case OperandType.InlineNone: break;
                case OperandType.ShortInlineBrTarget or OperandType.ShortInlineI or OperandType.ShortInlineVar: i += 1; break;
                case OperandType.InlineVar: i += 2; break;
                case OperandType.InlineI8 or OperandType.InlineR: i += 8; break;
                case OperandType.InlineSwitch: i += 4 + 4 * BitConverter.ToInt32(il, i); break;
                default: i += 4; break; // InlineBrTarget, InlineI, InlineSig, InlineString, ShortInlineR
            }
        }
    }
}
