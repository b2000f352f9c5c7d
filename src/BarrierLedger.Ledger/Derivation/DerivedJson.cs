using System.Text.Json;
using System.Text.Json.Serialization;
using BarrierLedger.Core.Checks;

namespace BarrierLedger.Ledger.Derivation;

internal static class DerivedJson
{
    public static readonly JsonSerializerOptions Options = new(JsonSerializerDefaults.Web)
    {
        DefaultIgnoreCondition = JsonIgnoreCondition.Never,
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
        // Reasons are stored with their severity as a word ("Failure", "Attention", "Info"), as they always were.
        Converters = { new JsonStringEnumConverter<CheckSeverity>() },
    };

    public static string Write<T>(T value) => JsonSerializer.Serialize(value, Options);

    public static T Read<T>(string json) => JsonSerializer.Deserialize<T>(json, Options)
        ?? throw new InvalidDataException("Stored derived values are empty.");
}
