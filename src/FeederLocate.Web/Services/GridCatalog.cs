using System.Collections.Concurrent;
using FeederLocate.Application.Grids;
using FeederLocate.Application.Naming;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Grids;
using FeederLocate.Storage.Incidents;
using FeederLocate.Web.OneLine;

namespace FeederLocate.Web.Services;

/// <summary>A stored grid version with the views the pages need: its graph and its one-line drawing.</summary>
public sealed record LoadedGrid(string Key, Grid Grid, NetworkGraph Graph, OneLineDrawing Drawing)
{
    public string Name => Grid.Name;

    private SegmentNames? _segmentNames;

    /// <summary>The stored version this is (1 for grids built outside the store, as in tests).</summary>
    public int Version => Stored?.Version ?? 1;

    /// <summary>Who stored this version, when and why; null for grids built outside the store.</summary>
    public GridVersion? Stored { get; init; }

    /// <summary>Why the one-line view could not be drawn, or null when it was.</summary>
    public string? DrawingProblem { get; init; }

    /// <summary>Operators' names of the sections: feeder and bounding devices (the same the command line and the handover use).</summary>
    public SectionNames SectionNames { get; } = GridNames.Sections(Graph);

    /// <summary>Operators' names of the segments: their section, and their place in it.</summary>
    public SegmentNames SegmentNames => _segmentNames ??= GridNames.Segments(Graph);

    /// <summary>The devices the incident page's forms offer, the same for every incident of this grid.</summary>
    public GridDeviceLists Devices { get; } = GridDeviceLists.Of(Grid);

    /// <summary>The section each segment is in.</summary>
    public IReadOnlyDictionary<SegmentId, SectionId> SectionOfSegment { get; } = Drawing.Segments.ToDictionary(s => s.Id, s => s.Section);

    private static readonly OneLineDrawing Nothing = new([], [], [], [], [], [], [], 0, 0);

    public static LoadedGrid Of(string key, Grid grid)
    {
        var graph = new NetworkGraph(grid);
        if (grid.Nodes.IsEmpty)
        {
            return new LoadedGrid(key, grid, graph, Nothing);
        }

        try
        {
            return new LoadedGrid(key, grid, graph, OneLineLayout.Draw(graph));
        }
        catch (Exception e) when (e is InvalidOperationException or ArgumentException or KeyNotFoundException or IndexOutOfRangeException)
        {
            return new LoadedGrid(key, grid, graph, Nothing) { DrawingProblem = $"The one-line view of grid \"{grid.Name}\" could not be drawn: {e.Message}" };
        }
    }
}

/// <summary>
/// The grids the control room works on, as stored versions in the database (<see cref="GridVersions"/>): the files of
/// the grid folder are brought in at start-up, and grids loaded since are kept as new versions. Pages and the API
/// show the latest version of each name; an incident is always shown on the version it is pinned to.
/// </summary>
public sealed class GridCatalog
{
    private readonly GridVersions _versions;
    private readonly ConcurrentDictionary<(string Name, int Version), LoadedGrid> _loaded = new();
    private readonly string? _defaultName;

    public GridCatalog(string folder, string defaultFile, GridVersions versions)
    {
        ArgumentNullException.ThrowIfNull(versions);
        _versions = versions;
        foreach (var file in Directory.Exists(folder) ? Directory.GetFiles(folder, "*.grid.json").Order(StringComparer.Ordinal) : Enumerable.Empty<string>())
        {
            var result = versions.LoadAtStartUp(Path.GetFileName(file), File.ReadAllText(file));
            if (result.GridName is { } name && Path.GetFileName(file) == defaultFile)
            {
                _defaultName = name;
            }
        }

        versions.Changed += _ => Changed?.Invoke();
    }

    /// <summary>Raised when a grid version is stored.</summary>
    public event Action? Changed;

    /// <summary>The stored versions behind the catalog.</summary>
    public GridVersions Versions => _versions;

    public LoadedGrid? Default => (_defaultName is null ? null : Find(_defaultName)) ?? All.FirstOrDefault();

    /// <summary>The latest version of every grid name.</summary>
    public IReadOnlyList<LoadedGrid> All => [.. _versions.Names().Select(n => Find(n)).OfType<LoadedGrid>()];

    /// <summary>The latest version of the grid named <paramref name="name"/>, or null.</summary>
    public LoadedGrid? Find(string name) => _versions.Latest(name) is { } latest ? Loaded(latest) : null;

    /// <summary>Version <paramref name="version"/> of the grid named <paramref name="name"/>, or null.</summary>
    public LoadedGrid? Find(string name, int version) => _versions.Find(name, version) is { } stored ? Loaded(stored) : null;

    /// <summary>The grid version <paramref name="state"/>'s incident is pinned to, or null when it is not stored.</summary>
    public LoadedGrid? For(IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(state);
        return Find(state.GridName, state.GridVersion);
    }

    /// <summary>The grids whose incidents <paramref name="user"/> may see, by name.</summary>
    public IReadOnlyList<LoadedGrid> VisibleTo(System.Security.Claims.ClaimsPrincipal user) =>
        [.. All.Where(g => Security.AccountClaims.MaySee(user, g.Name))];

    /// <summary>The grid a page opens on for <paramref name="user"/>: the default one if theirs, else their first.</summary>
    public LoadedGrid? DefaultFor(System.Security.Claims.ClaimsPrincipal user) =>
        Default is { } d && Security.AccountClaims.MaySee(user, d.Name) ? d : VisibleTo(user).FirstOrDefault();

    /// <summary>Loads a grid file's text as a new version (see <see cref="GridVersions.Load"/>): a stored name with other content needs <paramref name="replace"/> and a reason.</summary>
    public GridLoad Load(string fileName, string text, Actor actor, bool replace = false, string? reason = null) =>
        _versions.Load(text, fileName, actor, replace, reason);

    private LoadedGrid Loaded(VersionedGrid stored) =>
        _loaded.GetOrAdd((stored.Name, stored.Number), _ => LoadedGrid.Of(stored.Version.Source ?? stored.Name, stored.Grid) with { Stored = stored.Version });
}
