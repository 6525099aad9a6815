using System.Text.Json;

namespace Meanfield.Tests.Cli;

/// <summary>Reads the node report's layout (orbits of members, totals) for the command tests.</summary>
internal static class NodeReport
{
    /// <summary>Every node of every orbit.</summary>
    public static List<JsonElement> Members(JsonDocument doc) =>
        doc.RootElement.GetProperty("orbits").EnumerateArray().SelectMany(o => o.GetProperty("members").EnumerateArray()).ToList();

    public static JsonElement Totals(JsonDocument doc) => doc.RootElement.GetProperty("totals");
}
