using System.IO.Compression;
using System.Text;

namespace BarrierLedger.Ledger.Tests.Support;

/// <summary>The <see cref="H3System"/> pathway as a BarrierLedger bundle (manifest per docs/formats.md), and as a zip with the saddle point's XYZ.</summary>
public static class H3Bundle
{
    public static string Manifest(string study = "Hydrogen exchange (bundle test)", string tsFile = "") => $$"""
        {
          "format": "barrierledger-bundle",
          "format_version": 1,
          "study": { "name": "{{study}}", "description": "invented test data" },
          "species": [
            { "label": "H2", "charge": 0, "multiplicity": 1 },
            { "label": "H", "charge": 0, "multiplicity": 2 },
            { "label": "TS", "charge": 0, "multiplicity": 2 }
          ],
          "calculations": [
            { "label": "h2", "species": "H2", "kind": "minimum", "level_of_theory": "{{H3System.Level}}", "energy_hartree": -1.17,
              "geometry": { "symbols": ["H", "H"], "positions_angstrom": [[0, 0, 0], [0.741, 0, 0]] }, "frequencies_cm1": [4400] },
            { "label": "h", "species": "H", "kind": "minimum", "level_of_theory": "{{H3System.Level}}", "energy_hartree": -0.5,
              "geometry": { "symbols": ["H"], "positions_angstrom": [[0, 0, 0]] } },
            { "label": "ts", "species": "TS", "kind": "saddle_point", "level_of_theory": "{{H3System.Level}}", "energy_hartree": -1.655,
              {{(tsFile.Length > 0 ? $"\"file\": \"{tsFile}\"," : "\"geometry\": { \"symbols\": [\"H\", \"H\", \"H\"], \"positions_angstrom\": [[0, 0, 0], [0.93, 0, 0], [1.86, 0, 0]] },")}}
              "modes": [
                { "frequency_cm1": -1500, "displacements": [[1, 0, 0], [-2, 0, 0], [1, 0, 0]] },
                { "frequency_cm1": 900, "displacements": [[0, 1, 0], [0, -2, 0], [0, 1, 0]] },
                { "frequency_cm1": 900, "displacements": [[0, 0, 1], [0, 0, -2], [0, 0, 1]] },
                { "frequency_cm1": 2000, "displacements": [[1, 0, 0], [0, 0, 0], [-1, 0, 0]] } ] }
          ],
          "reactions": [
            { "label": "H exchange", "description": "invented",
              "states": [
                { "label": "H2 + H", "kind": "minimum", "terms": [ { "species": "H2" }, { "species": "H" } ] },
                { "label": "TS", "kind": "saddle_point", "terms": [ { "species": "TS" } ], "calculation": "ts", "reaction_coordinate": [[1, 2], [2, 3]] },
                { "label": "H + H2", "kind": "minimum", "terms": [ { "species": "H" }, { "species": "H2" } ] } ] }
          ]
        }
        """;

    public static byte[] Zip(string study = "Hydrogen exchange (zip test)")
    {
        using var ms = new MemoryStream();
        using (var zip = new ZipArchive(ms, ZipArchiveMode.Create, leaveOpen: true))
        {
            void Add(string name, string text)
            {
                using var w = new StreamWriter(zip.CreateEntry(name).Open(), new UTF8Encoding(false));
                w.Write(text);
            }
            Add("bundle.json", Manifest(study, "ts.xyz"));
            Add("ts.xyz", H3System.TsXyz());
        }
        return ms.ToArray();
    }
}
