using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;

namespace FeederLocate.LoadTest;

/// <summary>The valid grids of a folder, as the web app loads them (<c>*.grid.json</c>, by file name).</summary>
public static class GridFolder
{
    public static IReadOnlyList<Grid> Read(string folder)
    {
        var grids = new List<Grid>();
        foreach (var file in Directory.GetFiles(folder, "*.grid.json").Order(StringComparer.Ordinal))
        {
            if (GridReader.Parse(File.ReadAllText(file)).Value is { } grid && grid.Indicators.Length > 0)
            {
                grids.Add(grid);
            }
        }

        return grids;
    }
}
