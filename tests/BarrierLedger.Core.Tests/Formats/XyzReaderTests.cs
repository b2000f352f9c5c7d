using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;
using static BarrierLedger.Core.Tests.Formats.FormatTestHelpers;

namespace BarrierLedger.Core.Tests.Formats;

public class XyzReaderTests
{
    private static ReadResult<XyzDocument> Read(string text) => XyzReader.Read(Utf8(text), "t.xyz");

    [Fact]
    public void Single_frame_with_bare_number_energy_and_atomic_numbers()
    {
        var r = Read("3\n-76.41\n8 0.0 0.0 0.0\nH 0.757 0.0 0.586\nh\t-0.757  0.0   0.586\n");
        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
        var f = Assert.Single(r.Value!.Frames);
        Assert.Equal(-76.41, f.EnergyHartree);
        Assert.Equal("OHH", string.Concat(f.Molecule.Elements.Select(e => e.Symbol)));
        Assert.Equal(new Vec3(-0.757, 0, 0.586), f.Molecule.PositionsAngstrom[2]);
        Assert.False(r.Value.Extended);
    }

    [Fact]
    public void Multi_frame_reads_every_frame_in_order_with_energy_key()
    {
        var text = "1\nenergy=-0.5\nH 0 0 0\n2\nenergy=-1.17 step=2\nH 0 0 0\nH 0 0 0.74\n\n";
        var r = Read(text);
        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
        Assert.Equal(2, r.Value!.Frames.Length);
        Assert.Equal(-1.17, r.Value.Last.EnergyHartree);
        Assert.Equal(4, r.Value.Last.FirstLine);
        Assert.Equal("2", r.Value.Last.Keys["STEP"]);
        // Both frames are doublet/singlet hydrogen: the single H atom has one electron and gets a warning, not an error.
        Assert.Contains(r.Warnings, w => w.Line == 2 && w.Message.Contains("odd"));
    }

    [Fact]
    public void Energy_unit_key_converts_to_hartree()
    {
        var r = Read("3\nenergy=-47951.9 energy_unit=kcal/mol\nO 0 0 0\nH 0.757 0 0.586\nH -0.757 0 0.586\n");
        // -47951.9 kcal/mol = -76.416 Eh with 627.5094740631 kcal/mol per hartree (CODATA 2018, see Energy).
        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
        Assert.Equal(-47951.9 / Energy.KcalPerMolPerHartree, r.Value!.Frames[0].EnergyHartree!.Value, 12);
    }

    [Fact]
    public void Fortran_exponent_is_accepted()
    {
        var r = Read("1\n-0.5D+00\nH 0.1D0 0 0\n");
        Assert.Equal(-0.5, r.Value!.Frames[0].EnergyHartree);
        Assert.Equal(0.1, r.Value.Frames[0].Molecule.PositionsAngstrom[0].X);
    }

    [Fact]
    public void Extended_xyz_with_properties_quoted_values_charge_multiplicity_and_lattice()
    {
        var text = "2\nLattice=\"10 0 0 0 10 0 0 0 10\" Properties=species:S:1:pos:R:3:forces:R:3 energy=-0.4 charge=1 multiplicity=2 note=\"H2 cation, \\\"test\\\"\"\n" +
                   "H 0 0 0 0.1 0.2 0.3\nH 0 0 1.05 0 0 0\n";
        var r = Read(text);
        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
        var f = r.Value!.Frames[0];
        Assert.True(r.Value.Extended);
        Assert.Equal(1, f.Molecule.Charge);
        Assert.Equal(2, f.Molecule.Multiplicity);
        Assert.Equal("H2 cation, \"test\"", f.Keys["note"]);
        Assert.Equal(1.05, f.Molecule.PositionsAngstrom[1].Z);
        var w = Assert.Single(r.Warnings);
        Assert.Equal(2, w.Line);
        Assert.Contains("Lattice is ignored", w.Message);
    }

    [Fact]
    public void Extended_xyz_columns_may_come_in_any_order()
    {
        var r = Read("1\nProperties=pos:R:3:Z:I:1 charge=0 multiplicity=2\n0.5 0.25 0 1\n");
        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
        Assert.Equal("H", r.Value!.Frames[0].Molecule.Elements[0].Symbol);
        Assert.Equal(0.25, r.Value.Frames[0].Molecule.PositionsAngstrom[0].Y);
    }

    // Table of error messages: input, expected line, wording fragments.
    public static TheoryData<string, int, string[]> Errors => new()
    {
        { "x\n\nH 0 0 0\n", 1, ["expected the number of atoms", "'x'"] },
        { "0\n\n", 1, ["atom count is 0"] },
        { "2\n\nH 0 0 0\n", 1, ["declares 2 atoms", "ends after 1 atom line"] },
        { "1\n\nH 0 0\n", 3, ["expected an element and 3 coordinates", "found 3 field(s)"] },
        { "1\n\nXx 0 0 0\n", 3, ["unknown element 'Xx'"] },
        { "1\n\n250 0 0 0\n", 3, ["atomic number '250'"] },
        { "1\n\nH 0 abc 0\n", 3, ["coordinate y of atom 1", "'abc'", "expected a number"] },
        { "1\n\nH 0 0 NaN\n", 3, ["coordinate z of atom 1", "finite"] },
        { "1\n\nH 0 0 Infinity\n", 3, ["coordinate z", "finite"] },
        { "2\n\nH 0 0 0\nH 0 0 0.001\n", 1, ["atoms H1 and H2 are at the same position"] },
        { "1\n12.5\nH 0 0 0\n", 2, ["not negative", "hartree"] },
        { "3\n-47951.9\nO 0 0 0\nH 0.757 0 0.586\nH -0.757 0 0.586\n", 2, ["below", "lowest plausible", "H2O", "kcal/mol"] },
        { "1\nenergy=abc\nH 0 0 0\n", 2, ["energy='abc' is not a number"] },
        { "1\ncharge=1 multiplicity=0\nH 0 0 0\n", 2, ["multiplicity='0'"] },
        { "1\ncharge=0 multiplicity=1\nH 0 0 0\n", 2, ["1 electrons cannot have spin multiplicity 1"] },
        { "1\nenergy=-0.5 energy_unit=furlong\nH 0 0 0\n", 2, ["energy_unit 'furlong'"] },
        { "1\nProperties=species:S:1:pos:R\nH 0 0 0\n", 2, ["name:type:count triplets"] },
        { "1\nProperties=species:S:1:vel:R:3\nH 0 0 0\n", 2, ["pos:R:3"] },
        { "1\nProperties=species:S:1:pos:R:3 note=\"open\nH 0 0 0\n", 2, ["never closed"] },
        { "1\nProperties=species:S:1:pos:R:3:forces:R:3 charge=0 multiplicity=2\nH 0 0 0\n", 3, ["expected 7 columns", "found 4"] },
        { "1\n\nH 0 0 0\nH 0 0 1\n", 4, ["expected the number of atoms", "declared 1 atoms"] },
        { "", 1, ["file is empty"] },
        { "1\n\nH 0 0 0\0", 3, ["NUL byte", "binary"] },
    };

    [Theory]
    [MemberData(nameof(Errors))]
    public void Error_messages_name_the_line_and_what_was_expected(string input, int line, string[] fragments) =>
        SingleError(Read(input), line, null, fragments);

    [Fact]
    public void Errors_in_several_frames_are_all_listed()
    {
        var r = Read("1\n\nQq 0 0 0\n1\n\nH 0 0 zz\n");
        Assert.Equal([3, 6], r.Errors.Select(e => e.Line!.Value));
    }

    [Fact]
    public void Limits_stop_large_inputs_before_reading_them()
    {
        var limits = new ReaderLimits(MaxAtoms: 2);
        var r = XyzReader.Read(Utf8("3\n\nH 0 0 0\nH 0 0 1\nH 0 0 2\n"), "big.xyz", limits);
        SingleError(r, 1, null, "atom count 3 is above the limit of 2");
        r = XyzReader.Read(Utf8("1\n\nH 0 0 0\n1\n\nH 0 0 0\n"), "many.xyz", new ReaderLimits(MaxFrames: 1));
        SingleError(r, 4, null, "more than 1 frames");
        r = XyzReader.Read(Utf8(new string(' ', 200)), "huge.xyz", new ReaderLimits(MaxBytes: 100));
        SingleError(r, null, null, "larger than the limit of 100 bytes");
    }

    [Fact]
    public void Free_text_comment_gives_no_energy_and_a_warning_only_when_it_mentions_energy()
    {
        var r = Read("1\nhydrogen atom, doublet\nH 0 0 0\n");
        Assert.Null(r.Value!.Frames[0].EnergyHartree);
        Assert.DoesNotContain(r.Warnings, w => w.Message.Contains("mentions an energy"));
        r = Read("1\nfinal energy: -0.5\nH 0 0 0\n");
        Assert.Null(r.Value!.Frames[0].EnergyHartree);
        Assert.Contains(r.Warnings, w => w.Line == 2 && w.Message.Contains("Accepted forms"));
    }

    [Fact]
    public void Issue_list_is_capped_and_says_how_many_were_left_out()
    {
        var lines = string.Concat(Enumerable.Repeat("1\n\nQq 0 0 0\n", 30));
        var r = XyzReader.Read(Utf8(lines), "t.xyz", new ReaderLimits(MaxIssues: 5));
        Assert.Equal(6, r.Issues.Length);
        Assert.Contains("25 further error(s)", r.Issues[^1].Message);
    }
}
