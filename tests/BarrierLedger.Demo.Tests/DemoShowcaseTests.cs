using System.Text;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Paths;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Tests.Formats;
using BarrierLedger.Demo.Tests.ReferenceData;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Demo.Tests;

/// <summary>
/// The committed demo folder (seed-data/) read back through the real readers and run through the real checks.
/// </summary>
public class DemoShowcaseTests
{
    private static string Folder => RepoFiles.Path("seed-data");

    private static readonly Lazy<Bundle> s_bundle = new(() =>
    {
        using var manifest = File.OpenRead(Path.Combine(Folder, DemoWriter.ManifestName));
        var result = BundleReader.Read(manifest, DemoWriter.ManifestName, openFile: p => File.OpenRead(Path.Combine(Folder, p)));
        Assert.True(result.Succeeded, string.Join("\n", result.Issues));
        return result.Value!;
    });

    private static Bundle Bundle => s_bundle.Value;

    [Fact]
    public void Committed_folder_equals_the_generator_output_byte_for_byte()
    {
        var expected = DemoData.Showcase();
        var onDisk = Directory.EnumerateFiles(Folder, "*", SearchOption.AllDirectories)
            .Select(f => Path.GetRelativePath(Folder, f).Replace(Path.DirectorySeparatorChar, '/'))
            .Order(StringComparer.Ordinal).ToArray();
        Assert.Equal(expected.Select(f => f.RelativePath).Order(StringComparer.Ordinal).ToArray(), onDisk);
        foreach (var f in expected)
        {
            var bytes = File.ReadAllBytes(Path.Combine(Folder, f.RelativePath));
            Assert.True(bytes.AsSpan().SequenceEqual(new UTF8Encoding(false).GetBytes(f.Content)),
                $"seed-data/{f.RelativePath} differs from the generator output; run `barrierledger demo generate --out seed-data` and commit.");
        }
    }

    [Fact]
    public void Reading_the_bundle_gives_no_errors_and_no_warnings()
    {
        using var manifest = File.OpenRead(Path.Combine(Folder, DemoWriter.ManifestName));
        var result = BundleReader.Read(manifest, DemoWriter.ManifestName, openFile: p => File.OpenRead(Path.Combine(Folder, p)));
        Assert.Empty(result.Issues);
        Assert.Contains("invented", result.Value!.Study.Description, StringComparison.Ordinal);
        Assert.Equal(8, result.Value.Reactions.Length);
    }

    /// <summary>What each saddle point must get from the frequency check, and why.</summary>
    public static TheoryData<string, string, Verdict, string> SaddleVerdicts => new()
    {
        // One imaginary mode on both forming C–C bonds; the scan maximum lies at the saddle geometry's C1–C6 distance.
        { "DA", "TS", Verdict.Passed, SaddleCheckCodes.NearScanMaximum },
        // The reaction mode moves N1–C2/C2–Cl3, but both N-methyl groups turn with imaginary frequencies below 100i cm⁻¹.
        { "MT", "TS", Verdict.NeedsAttention, SaddleCheckCodes.SoftImaginaryMode },
        // Both S_N2 steps of the catalysed pathway: one imaginary mode along the entering/leaving bonds.
        { "IX", "TS1", Verdict.Passed, SaddleCheckCodes.ReactionMode },
        { "IX", "TS2", Verdict.Passed, SaddleCheckCodes.ReactionMode },
        // The stored structure is the eclipsed rotamer: its one significant mode is a methyl turn, not C–F/H–F.
        { "EL", "TS", Verdict.Failed, SaddleCheckCodes.ModeMissesReactionBond },
        // The saddle point itself is fine (the jump is in the scan, on the product side of the maximum).
        { "CB", "TS", Verdict.Passed, SaddleCheckCodes.NearScanMaximum },
        // A clean hydrogen-transfer mode; what is wrong in KE is the levels of theory, not the saddle point.
        { "KE", "TS", Verdict.Passed, SaddleCheckCodes.ReactionMode },
        // KE's hydrogen shift again: its mode moves C2–H4, one of the declared bonds, so the mode alone does not catch it; the
        // IRC does (Each_IRC_gets_its_intended_connection_verdict).
        { "EO", "TS", Verdict.Passed, SaddleCheckCodes.ReactionMode },
        // The butyl version of IX's first step, on the anti-chain saddle-point conformer the state names.
        { "BU", "TS", Verdict.Passed, SaddleCheckCodes.ReactionMode },
    };

    [Theory]
    [MemberData(nameof(SaddleVerdicts))]
    public void Each_saddle_point_gets_its_intended_frequency_verdict(string reaction, string state, Verdict verdict, string keyCode)
    {
        var result = Check(reaction, state);
        Assert.True(verdict == result.Verdict, $"{reaction} {state}: expected {verdict}, got\n{result.Report()}");
        Assert.Contains(result.Reasons, r => r.Code == keyCode);
    }

    [Fact]
    public void The_rotor_case_has_exactly_two_soft_rotor_like_modes_and_one_reaction_mode()
    {
        var result = Check("MT", "TS");
        Assert.Equal(2, result.SoftModes.Count);
        Assert.All(result.SoftModes, s => Assert.True(s.Character.RotorLike, s.Character.Summary));
        Assert.NotNull(result.SignificantCharacter);
        Assert.Contains(result.SignificantCharacter!.Leading(2), c => c.IsReactionBond);
    }

    [Fact]
    public void The_failing_saddle_point_turns_the_methyl_group_about_C1_C2()
    {
        // Not reported as rotor-like: the declared F3–H6 pair closes a ring through the methyl hydrogen H6.
        var result = Check("EL", "TS");
        Assert.Equal(ModeClass.Torsion, result.SignificantCharacter!.Class);
        Assert.Equal("torsion about C1–C2", result.SignificantCharacter.Components[0].Label);
        Assert.True(Math.Abs(result.SignificantMode!.FrequencyCm1) >= 100);
    }

    /// <summary>What each scan must get from the scan analysis, and why.</summary>
    [Fact]
    public void The_clean_scan_has_no_flags_and_the_jump_scan_only_a_jump()
    {
        var clean = Scan("TS-DA");
        Assert.Empty(clean.Flags); // smooth profile, regular steps, no bond changes besides the scanned one (both forming bonds stay > 1.8 Å)
        Assert.NotNull(clean.HighestMaximum);

        var jumpy = Scan("TS-CB");
        Assert.NotEmpty(jumpy.Flags);
        Assert.All(jumpy.Flags, f => Assert.Equal(ScanFlagCodes.Jump, f.Code)); // a 6 kcal/mol drop where the CH2 on C4 flipped, nothing else
        Assert.Contains(jumpy.Flags, f => jumpy.Points[f.PointIndex].Coordinate is > 2.55 and < 2.75);
    }

    /// <summary>What each pathway must get from the consistency check, and why.</summary>
    public static TheoryData<string, Verdict> ConsistencyVerdicts => new()
    {
        { "DA", Verdict.Passed },
        { "MT", Verdict.Passed },
        { "IX", Verdict.Passed },     // CH3ClFI, charge −2 in every state, although the species differ
        { "EL", Verdict.Passed },     // the frequency check fails, the energies are still consistent
        { "CB", Verdict.Passed },
        { "KE", Verdict.Failed },     // vinyl alcohol's single point sits on a def2-TZVP geometry: two electronic levels
        { "EO", Verdict.Passed },     // the saddle point belongs to another reaction, but the energies are consistent
        { "BU", Verdict.Passed },     // C4H9ClI⁻ in every state; every conformer at the study's levels
    };

    [Theory]
    [MemberData(nameof(ConsistencyVerdicts))]
    public void Each_pathway_gets_its_intended_consistency_verdict(string reaction, Verdict verdict)
    {
        var result = BarrierConsistency.Check(PathwayOf(reaction));
        Assert.True(verdict == result.Verdict, $"{reaction}: expected {verdict}, got\n{result.Report()}");
        if (verdict == Verdict.Failed) Assert.Contains(result.Reasons, r => r.Code == ConsistencyCodes.MixedElectronicLevels);
    }

    [Theory]
    [MemberData(nameof(ConsistencyVerdicts))]
    public void The_consistency_verdicts_hold_with_geometry_level_energies_too(string reaction, Verdict verdict)
    {
        // Whichever energies an energy model takes (single points or the optimisations), KE mixes levels and the rest do not.
        var result = BarrierConsistency.Check(PathwayOf(reaction, singlePoints: false));
        Assert.True(verdict == result.Verdict, $"{reaction}: expected {verdict}, got\n{result.Report()}");
    }

    [Fact]
    public void The_catalyst_appears_in_several_states_of_the_two_step_pathway()
    {
        var ix = Bundle.Reactions.Single(r => r.Label == "IX");
        Assert.Equal(2, ix.States.Count(s => s.Kind == StateKind.SaddlePoint));
        Assert.True(ix.States.Count(s => s.Terms.Any(t => t.Species == "iodide")) >= 2);
        Assert.Equal(StateKind.Minimum, ix.States[2].Kind); // the intermediate, iodomethane + chloride + fluoride
    }

    [Fact]
    public void Every_minimum_has_only_real_frequencies()
    {
        foreach (var c in Bundle.Calculations.Where(c => c.Kind == CalculationKind.Minimum))
        {
            if (c.Geometry!.AtomCount == 1)
            {
                Assert.Empty(c.HessianHartreePerBohr2); // a lone ion: energy only
                continue;
            }
            if (c.HessianHartreePerBohr2.Length == 0)
            {
                // Only BU's aa conformer is stored optimised with its frequencies still to come (what the lower-conformer check needs).
                Assert.Equal("1-chlorobutane aa opt", c.Label);
                continue;
            }
            var modes = FrequencyAnalysis.FromHessian(c.Geometry!, [.. c.HessianHartreePerBohr2]).Modes;
            Assert.True(modes.All(m => m.FrequencyCm1 > 50), $"{c.Label}: lowest mode {modes.Min(m => m.FrequencyCm1):0.0} cm⁻¹");
        }
    }

    [Fact]
    public void Structures_have_standard_bond_lengths_and_no_close_contacts()
    {
        // A state's reacting bonds hold for every saddle-point conformer of its species (the same atoms in the same order).
        var reactionPairs = Bundle.Reactions.SelectMany(r => r.States)
            .Where(s => s.Calculation is not null)
            .SelectMany(s => s.ReactionCoordinate.SelectMany(p => Bundle.Calculations
                .Where(c => c.Kind == CalculationKind.SaddlePoint && c.Species == s.Terms[0].Species)
                .Select(c => (c.Label, new Bond(p.First - 1, p.Second - 1)))))
            .ToHashSet();
        foreach (var c in Bundle.Calculations.Where(c => c.Geometry is { AtomCount: > 1 } && c.Kind != CalculationKind.SinglePoint))
        {
            var m = c.Geometry!;
            var bonds = Connectivity.Of(m);
            foreach (var b in bonds.Bonds.Where(b => !reactionPairs.Contains((c.Label, b))))
            {
                var (e1, e2) = (m.Elements[b.A].Symbol, m.Elements[b.B].Symbol);
                var key = string.CompareOrdinal(e1, e2) <= 0 ? $"{e1}-{e2}" : $"{e2}-{e1}";
                var (lo, hi) = StandardGeometry.BondLengthAngstrom[key];
                var d = (m.PositionsAngstrom[b.A] - m.PositionsAngstrom[b.B]).Length;
                Assert.True(d >= lo && d <= hi, $"{c.Label}: {b.Label(m)} is {d:0.000} Å, outside {lo}–{hi} ({StandardGeometry.Source})");
            }
            // Across a partly formed bond, 1,3 distances are short by nature (the four-membered ring of TS-KE): count those pairs as bonded.
            var graph = new Connectivity(m.AtomCount, bonds.Bonds.Concat(reactionPairs.Where(x => x.Item1 == c.Label).Select(x => x.Item2)));
            for (var i = 0; i < m.AtomCount; i++)
                for (var j = i + 1; j < m.AtomCount; j++)
                {
                    if (graph.AreBonded(i, j) || graph.Neighbours(i).Any(k => graph.AreBonded(k, j))) continue;
                    var d = (m.PositionsAngstrom[i] - m.PositionsAngstrom[j]).Length;
                    Assert.True(d >= StandardGeometry.MinNonbondedContactAngstrom, $"{c.Label}: {m.AtomLabel(i)}···{m.AtomLabel(j)} only {d:0.000} Å apart");
                }
        }
        var da = Bundle.Calculations.Single(c => c.Label == "TS-DA opt+freq").Geometry!;
        foreach (var (a, b) in new[] { (0, 5), (3, 4) })
        {
            var d = (da.PositionsAngstrom[a] - da.PositionsAngstrom[b]).Length;
            Assert.InRange(d, StandardGeometry.FormingCarbonCarbonAngstrom.Min, StandardGeometry.FormingCarbonCarbonAngstrom.Max);
        }
    }

    [Fact]
    public void Barriers_are_in_plausible_ranges()
    {
        // Invented energies, but within the usual range for such reactions (common practice, no source): 10–70 kcal/mol
        // above the preceding minimum, and every saddle point above both neighbours.
        foreach (var r in Bundle.Reactions.Where(r => r.Label != "EL"))
        {
            var p = PathwayOf(r.Label);
            for (var i = 1; i < p.States.Count - 1; i++)
            {
                if (p.States[i].Kind != StateKind.SaddlePoint) continue;
                var up = (p.States[i].ElectronicEnergy - p.States[i - 1].ElectronicEnergy).KcalPerMol;
                var down = (p.States[i].ElectronicEnergy - p.States[i + 1].ElectronicEnergy).KcalPerMol;
                Assert.InRange(up, 10, 70);
                Assert.True(down > 0, $"{r.Label} {p.States[i].Label} is below the next state");
            }
        }
    }

    /// <summary>Where each demo IRC must lead (issue 20), and the headline the review queue shows.</summary>
    public static TheoryData<string, Connection, string> IrcVerdicts => new()
    {
        // The 1,3-hydrogen shift's IRC runs from acetaldehyde to vinyl alcohol: both neighbours of TS-KE.
        { "KE", Connection.BothSides, "connects acetaldehyde and vinyl alcohol" },
        // The same shift stored as the saddle point of a ring closure: one end is acetaldehyde, the other vinyl alcohol (a state
        // of KE), not the oxirane drawn; oxirane's bond graph (C2–O3, C1–H4) differs from vinyl alcohol's (O3–H4, no C2–O3).
        { "EO", Connection.OneSide, "connects acetaldehyde with vinyl alcohol (KE), not oxirane" },
    };

    [Theory]
    [MemberData(nameof(IrcVerdicts))]
    public void Each_IRC_gets_its_intended_connection_verdict(string reaction, Connection connection, string headline)
    {
        var r = Bundle.Reactions.Single(x => x.Label == reaction);
        var calc = Bundle.Calculations.Single(c => c.Label == r.States[1].Calculation);
        var irc = Bundle.Ircs.Single(i => i.SaddlePoint == calc.Label);
        var formula = Formula.Of(calc.Geometry!);
        StateStructure Of(BundleState s, string label) => new(label, [.. s.Terms.Select(t => new StateSpecies(t.Species,
            Bundle.Calculations.First(c => c.Species == t.Species && c.Kind == CalculationKind.Minimum).Geometry!, t.Coefficient))]);
        var others = Bundle.Reactions.Where(x => x.Label != reaction)
            .SelectMany(x => x.States.Where(s => s.Kind == StateKind.Minimum).Select(s => Of(s, $"{s.Label} ({x.Label})")))
            .Where(s => s.Formula == formula).ToList();
        var path = IrcPath.FromFrames([.. irc.Structures.Structures.Select(f => f.Geometry)], [.. irc.Structures.Structures.Select(f => f.EnergyHartree!.Value)], calc.Geometry);
        var result = ConnectionCheck.Run(new ConnectionCheckInput(calc.Geometry!, Of(r.States[0], r.States[0].Label), Of(r.States[2], r.States[2].Label), others, path));
        Assert.True(connection == result.Connection, result.Report());
        Assert.Equal(headline, result.Headline);
        Assert.Equal(connection == Connection.BothSides ? Verdict.Passed : Verdict.Failed, result.Verdict);
        // The ends are the minima themselves (superposed, rounded to 1e-6 Å in the files): RMSD below 1e-5 Å (construction).
        Assert.All(result.Ends, e => Assert.InRange(e.Reached!.RmsdAngstrom, 0, 1e-5));
    }

    [Fact]
    public void Every_saddle_point_conformer_has_exactly_one_imaginary_frequency()
    {
        // The unchecked saddle-point conformer of BU must be a true saddle point too, only never checked by the ledger.
        var saddles = Bundle.Calculations.Where(c => c.Kind == CalculationKind.SaddlePoint).ToList();
        Assert.Contains(saddles, c => c.Label == "TS-BU chain g+ opt+freq");
        foreach (var c in saddles)
        {
            var modes = FrequencyAnalysis.FromHessian(c.Geometry!, [.. c.HessianHartreePerBohr2]).Modes;
            // MT's two soft rotor modes are its point (The_rotor_case_...); every other saddle point has one imaginary mode.
            var expected = c.Label == "TS-MT opt+freq" ? 3 : 1;
            Assert.True(expected == modes.Count(m => m.FrequencyCm1 < 0), $"{c.Label}: {string.Join(", ", modes.Where(m => m.FrequencyCm1 < 0).Select(m => m.FrequencyCm1.ToString("0")))}");
        }
    }

    [Fact]
    public void The_conformer_reaction_has_a_mirror_image_pair_a_duplicate_and_a_lower_conformer_without_frequencies()
    {
        var conformers = Bundle.Calculations.Where(c => c.Species == "1-chlorobutane" && c.Kind == CalculationKind.Minimum)
            .ToDictionary(c => c.Conformer, c => c.Geometry!.PositionsAngstrom.Take(5).ToList()); // C1–C4 and Cl5: the heavy atoms
        Assert.Equal(["aa", "g+a", "g+a (2)", "g+g+", "g−a"], conformers.Keys.Order(StringComparer.Ordinal));
        // Mirror images: reflecting g+a's heavy atoms through the xy plane (z → −z) gives g−a's up to a rigid motion: Kabsch RMSD 0
        // (analytic); without the reflection no rotation superposes them.
        var mirrored = conformers["g+a"].Select(p => p with { Z = -p.Z }).ToList();
        Assert.InRange(Kabsch.Superpose(mirrored, conformers["g−a"]).RmsdAngstrom, 0, 1e-5);
        Assert.True(Kabsch.Superpose(conformers["g+a"], conformers["g−a"]).RmsdAngstrom > 0.3);
        // The re-optimised copy is within the 0.1 Å duplicate threshold of issue 21.
        Assert.InRange(Kabsch.Superpose(conformers["g+a (2)"], conformers["g+a"]).RmsdAngstrom, 0.001, 0.1);
        var aa = Bundle.Calculations.Single(c => c.Label == "1-chlorobutane aa opt");
        Assert.Empty(aa.HessianHartreePerBohr2);
    }

    private static SaddleCheckResult Check(string reaction, string stateLabel)
    {
        var state = Bundle.Reactions.Single(r => r.Label == reaction).States.Single(s => s.Label == stateLabel);
        var calc = Bundle.Calculations.Single(c => c.Label == state.Calculation);
        var scan = Bundle.Scans.SingleOrDefault(s => s.Species == calc.Species);
        var input = SaddleCheckInput.FromHessian(calc.Geometry!, [.. calc.HessianHartreePerBohr2],
            [.. state.ReactionCoordinate.Select(p => (p.First - 1, p.Second - 1))],
            scan is null ? null : ScanAnalysis.Analyze(scan.Points, scan.Coordinate));
        return SaddleCheck.Run(input);
    }

    private static ScanProfile Scan(string species)
    {
        var scan = Bundle.Scans.Single(s => s.Species == species);
        return ScanAnalysis.Analyze(scan.Points, scan.Coordinate);
    }

    /// <summary>
    /// The pathway with electronic energies from each species' high-level single point (the calculation whose level has '//'),
    /// or with <paramref name="singlePoints"/> false from its optimisation (a lone atom's energy at the geometry level).
    /// </summary>
    private static Pathway PathwayOf(string reaction, bool singlePoints = true)
    {
        var records = new Dictionary<string, SpeciesRecord>();
        SpeciesRecord Record(string label)
        {
            if (records.TryGetValue(label, out var r)) return r;
            var sp = Bundle.Species.Single(s => s.Label == label);
            // A species with conformers (BU) enters with its lowest conformer, as the ledger's "lowest conformer" choice takes it.
            var single = Bundle.Calculations.Where(c => c.Species == label && (singlePoints
                ? c.Kind == CalculationKind.SinglePoint && c.LevelOfTheory.GeometryLevel is not null
                : c.LevelOfTheory.GeometryLevel is null)).MinBy(c => c.EnergyHartree!.Value)!;
            return records[label] = new SpeciesRecord(label, Formula.Of(single.Geometry!), sp.Charge, sp.Multiplicity,
                Energy.FromHartree(single.EnergyHartree!.Value), single.LevelOfTheory, Geometry: single.Geometry);
        }
        var r = Bundle.Reactions.Single(x => x.Label == reaction);
        return new Pathway(r.Label, [.. r.States.Select(s => new PathwayState(s.Label,
            s.Kind,
            [.. s.Terms.Select(t => new StateTerm(Record(t.Species), t.Coefficient))]))]);
    }
}
