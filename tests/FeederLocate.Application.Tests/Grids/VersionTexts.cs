using System.Text.Json.Nodes;
using FeederLocate.Core.Formats;

namespace FeederLocate.Application.Tests.Grids;

/// <summary>Brackenfold's grid text, and versions of it changed by hand.</summary>
internal static class VersionTexts
{
    public static string Original { get; } = GridWriter.Write(TestGrids.Brackenfold());

    /// <summary>S2 lengthened from 3 km to 3.4 km.</summary>
    public static string S2Longer { get; } = Edit(g => g["segments"]![1]!["lengthKm"] = 3.4);

    /// <summary>FI3 removed.</summary>
    public static string WithoutFi3 { get; } = Edit(g => g["indicators"]!.AsArray().RemoveAt(2));

    /// <summary>FI1 removed.</summary>
    public static string WithoutFi1 { get; } = Edit(g => g["indicators"]!.AsArray().RemoveAt(0));

    public static string Edit(Action<JsonObject> change)
    {
        var grid = JsonNode.Parse(Original)!.AsObject();
        change(grid);
        return grid.ToJsonString();
    }
}
