using System.Net.Http.Headers;
using System.Text;

namespace BarrierLedger.Web.Tests.Api;

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
}
