using System.Collections.Concurrent;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using FeederLocate.Web.OneLine;

namespace FeederLocate.Web.Services;

/// <summary>A loaded grid with the views the pages need: its graph and its one-line drawing.</summary>
public sealed record LoadedGrid(string Key, Grid Grid, NetworkGraph Graph, OneLineDrawing Drawing)
{
    public string Name => Grid.Name;

    private SegmentNames? _segmentNames;

    /// <summary>Operators' names of the sections: feeder and bounding devices.</summary>
    public SectionNames SectionNames { get; } = SectionNames.Build(Graph, FeederMap.Build(Graph));

    /// <summary>Operators' names of the segments: their section, and their place in it.</summary>
    public SegmentNames SegmentNames => _segmentNames ??= SegmentNames.Build(Graph, FeederMap.Build(Graph), SectionNames);

    /// <summary>The section each segment is in.</summary>
    public IReadOnlyDictionary<SegmentId, SectionId> SectionOfSegment { get; } = Drawing.Segments.ToDictionary(s => s.Id, s => s.Section);

    public static LoadedGrid Of(string key, Grid grid)
    {
        var graph = new NetworkGraph(grid);
        return new LoadedGrid(key, grid, graph, OneLineLayout.Draw(graph));
    }
}

/// <summary>The grids the control room works on: the files of the grid folder, and any loaded since.</summary>
public sealed class GridCatalog
{
    private readonly ConcurrentDictionary<string, LoadedGrid> _byName = new(StringComparer.Ordinal);

    public GridCatalog(string folder, string defaultFile)
    {
        foreach (var file in Directory.Exists(folder) ? Directory.GetFiles(folder, "*.grid.json").Order(StringComparer.Ordinal) : Enumerable.Empty<string>())
        {
            var result = GridReader.Parse(File.ReadAllText(file));
            if (result.Value is { } grid)
            {
                var loaded = LoadedGrid.Of(Path.GetFileName(file), grid);
                _byName[grid.Name] = loaded;
                if (Path.GetFileName(file) == defaultFile)
                {
                    Default = loaded;
                }
            }
        }

        Default ??= _byName.Values.OrderBy(g => g.Name, StringComparer.Ordinal).FirstOrDefault();
    }

    /// <summary>Raised when a grid is added.</summary>
    public event Action? Changed;

    public LoadedGrid? Default { get; private set; }

    public IReadOnlyList<LoadedGrid> All => [.. _byName.Values.OrderBy(g => g.Name, StringComparer.Ordinal)];

    public LoadedGrid? Find(string name) => _byName.GetValueOrDefault(name);

    /// <summary>The grids whose incidents <paramref name="user"/> may see, by name.</summary>
    public IReadOnlyList<LoadedGrid> VisibleTo(System.Security.Claims.ClaimsPrincipal user) =>
        [.. All.Where(g => Security.AccountClaims.MaySee(user, g.Name))];

    /// <summary>The grid a page opens on for <paramref name="user"/>: the default one if theirs, else their first.</summary>
    public LoadedGrid? DefaultFor(System.Security.Claims.ClaimsPrincipal user) =>
        Default is { } d && Security.AccountClaims.MaySee(user, d.Name) ? d : VisibleTo(user).FirstOrDefault();

    /// <summary>Reads a grid file's text; adds it when valid, and gives every issue found either way.</summary>
    public LoadResult<Grid> Add(string fileName, string text)
    {
        var result = GridReader.Parse(text);
        if (result.Value is { } grid)
        {
            _byName[grid.Name] = LoadedGrid.Of(fileName, grid);
            Changed?.Invoke();
        }

        return result;
    }
}
