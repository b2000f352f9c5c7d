using System.Net.Http.Headers;
using System.Text;

namespace BarrierLedger.Web.Tests.Endpoints;

/// <summary>Small invented inputs and the multipart bodies the API takes.</summary>
internal static class ApiFiles
{
    public const string Study = "API test study";
    public const string Level = "MODEL-A/basis-1";

    /// <summary>A water geometry (bond length and angle close to the textbook 0.957 Å and 104.5°, from memory) with an invented energy.</summary>
    public static byte[] WaterXyz(double energyHartree = -76.4189) => Encoding.UTF8.GetBytes(
        $"3\nenergy={energyHartree.ToString(System.Globalization.CultureInfo.InvariantCulture)}\n" +
        "O 0.000000 0.000000 0.117300\nH 0.000000 0.757200 -0.469200\nH 0.000000 -0.757200 -0.469200\n");

    public static Dictionary<string, string> WaterChoices(string species = "H2O") => new()
    {
        ["study"] = Study, ["species"] = species, ["kind"] = "Minimum", ["level"] = Level, ["charge"] = "0", ["multiplicity"] = "1",
    };

    public static MultipartFormDataContent Form(IEnumerable<(string Name, byte[] Content)> files, IReadOnlyDictionary<string, string>? fields = null)
    {
        var form = new MultipartFormDataContent();
        foreach (var (name, content) in files)
        {
            var part = new ByteArrayContent(content);
            part.Headers.ContentType = new MediaTypeHeaderValue("application/octet-stream");
            form.Add(part, "files", name);
        }
        foreach (var (k, v) in fields ?? new Dictionary<string, string>()) form.Add(new StringContent(v), k);
        return form;
    }

    /// <summary>
    /// An invented H + H2 exchange pathway as a bundle manifest (docs/formats.md): two minima and a linear saddle point with one
    /// imaginary antisymmetric-stretch mode; energies are invented round numbers.
    /// </summary>
    public static byte[] ExchangeBundle(string study = "API bundle study") => Encoding.UTF8.GetBytes($$"""
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
            { "label": "h2", "species": "H2", "kind": "minimum", "level_of_theory": "{{Level}}", "energy_hartree": -1.17,
              "geometry": { "symbols": ["H", "H"], "positions_angstrom": [[0, 0, 0], [0.741, 0, 0]] }, "frequencies_cm1": [4400] },
            { "label": "h", "species": "H", "kind": "minimum", "level_of_theory": "{{Level}}", "energy_hartree": -0.5,
              "geometry": { "symbols": ["H"], "positions_angstrom": [[0, 0, 0]] } },
            { "label": "ts", "species": "TS", "kind": "saddle_point", "level_of_theory": "{{Level}}", "energy_hartree": -1.655,
              "geometry": { "symbols": ["H", "H", "H"], "positions_angstrom": [[0, 0, 0], [0.93, 0, 0], [1.86, 0, 0]] },
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
        """);
}
