using System.Collections.Concurrent;
using FeederLocate.Core.Comparison;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Grids;

namespace FeederLocate.Application.Grids;

/// <summary>
/// The grids, kept in the database as numbered versions for any number of callers at once. A load of a new name
/// is its version 1; a load of a stored name with other content is refused until the loader confirms the
/// replacement with a reason, and then becomes the next version; nothing is ever replaced or removed. Incidents
/// stay on the version they were opened on (see <see cref="IncidentGridMove"/>).
/// </summary>
public sealed class GridVersions : IDisposable
{
    /// <summary>Who stores the grid files found at start-up.</summary>
    public static readonly Actor StartUp = new("start-up", "system");

    private readonly GridVersionStore _store;
    private readonly Lock _gate = new();
    private readonly ConcurrentDictionary<(string Name, int Version), VersionedGrid> _read = new();

    public GridVersions(GridVersionStore store)
    {
        ArgumentNullException.ThrowIfNull(store);
        _store = store;
    }

    /// <summary>Raised after a version was stored, with the grid's name.</summary>
    public event Action<string>? Changed;

    /// <summary>Every grid name with a stored version.</summary>
    public IReadOnlyList<string> Names()
    {
        lock (_gate)
        {
            return _store.GridNames();
        }
    }

    /// <summary>The versions of <paramref name="gridName"/>, oldest first.</summary>
    public IReadOnlyList<GridVersion> Versions(string gridName)
    {
        lock (_gate)
        {
            return _store.Versions(gridName);
        }
    }

    /// <summary>The newest version of <paramref name="gridName"/>, read, or null for a name never loaded.</summary>
    public VersionedGrid? Latest(string gridName)
    {
        GridVersion? latest;
        lock (_gate)
        {
            latest = _store.Latest(gridName);
        }

        return latest is null ? null : Find(gridName, latest.Version);
    }

    /// <summary>Version <paramref name="version"/> of <paramref name="gridName"/>, read once and kept; null when not stored or no longer readable.</summary>
    public VersionedGrid? Find(string gridName, int version)
    {
        ArgumentNullException.ThrowIfNull(gridName);
        if (_read.TryGetValue((gridName, version), out var known))
        {
            return known;
        }

        GridVersion? stored;
        string? text;
        lock (_gate)
        {
            stored = _store.Find(gridName, version);
            text = stored is null ? null : _store.TextOf(gridName, version);
        }

        if (stored is null || text is null || GridReader.Parse(text).Value is not { } grid)
        {
            return null;
        }

        return _read.GetOrAdd((gridName, version), new VersionedGrid(stored, grid));
    }

    /// <summary>
    /// Loads <paramref name="text"/> from <paramref name="source"/> (a file name, or null) as a new version: see
    /// the class summary. <paramref name="replace"/> with <paramref name="reason"/> confirms replacing a stored grid
    /// of the same name; only an engineer loads grids.
    /// </summary>
    public GridLoad Load(string text, string? source, Actor actor, bool replace = false, string? reason = null)
    {
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(actor);
        if (actor.Role is not ("engineer" or "system"))
        {
            return new GridLoad(GridLoadOutcome.Invalid, [], Refusal: "only an engineer loads grid files");
        }

        var read = GridReader.Parse(text);
        if (read.Value is not { } grid)
        {
            return new GridLoad(GridLoadOutcome.Invalid, read.Issues, Refusal: "the grid file has errors: nothing was stored");
        }

        GridLoad result;
        lock (_gate)
        {
            var latest = _store.Latest(grid.Name);
            if (latest is not null && latest.ContentSha256 == GridContent.Sha256(text))
            {
                return new GridLoad(GridLoadOutcome.Unchanged, read.Issues, grid.Name, latest, latest);
            }

            if (latest is not null && (!replace || string.IsNullOrWhiteSpace(reason)))
            {
                var difference = Find(grid.Name, latest.Version) is { } current ? GridComparison.Compare(current.Grid, grid) : null;
                return new GridLoad(GridLoadOutcome.NeedsConfirmation, read.Issues, grid.Name, null, latest, difference,
                    replace
                        ? $"give the reason for replacing grid \"{grid.Name}\" version {latest.Version}"
                        : $"grid \"{grid.Name}\" is stored as version {latest.Version}: confirm the replacement, with a reason, to store version {latest.Version + 1}; open incidents stay on the version they were opened on");
            }

            var stored = _store.Append(grid.Name, text, actor, reason, source);
            _read[(grid.Name, stored.Version)] = new VersionedGrid(stored, grid);
            var previous = latest is null ? null : Find(grid.Name, latest.Version);
            result = new GridLoad(GridLoadOutcome.Stored, read.Issues, grid.Name, stored, latest,
                previous is null ? null : GridComparison.Compare(previous.Grid, grid));
        }

        Changed?.Invoke(grid.Name);
        return result;
    }

    /// <summary>
    /// Brings a grid file found at start-up into the store: a name never stored becomes its version 1 (by
    /// <see cref="StartUp"/>); a text equal to any stored version of its name changes nothing (so a grid an engineer
    /// replaced since is not reverted); a text not stored yet becomes the next version, by start-up, with the file
    /// name and its SHA-256 as the reason. Open incidents stay on their versions either way.
    /// </summary>
    public GridLoad LoadAtStartUp(string fileName, string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var read = GridReader.Parse(text);
        if (read.Value is not { } grid)
        {
            return new GridLoad(GridLoadOutcome.Invalid, read.Issues, Refusal: $"grid file {fileName} has errors: not loaded");
        }

        var sha = GridContent.Sha256(text);
        lock (_gate)
        {
            var versions = _store.Versions(grid.Name);
            if (versions.FirstOrDefault(v => v.ContentSha256 == sha) is { } same)
            {
                return new GridLoad(GridLoadOutcome.Unchanged, read.Issues, grid.Name, same, versions[^1]);
            }

            var reason = versions.Count == 0
                ? $"grid file {fileName} at first start"
                : $"grid file {fileName} changed on disk (SHA-256 {sha})";
            var stored = _store.Append(grid.Name, text, StartUp, reason, fileName);
            _read[(grid.Name, stored.Version)] = new VersionedGrid(stored, grid);
            return new GridLoad(GridLoadOutcome.Stored, read.Issues, grid.Name, stored, versions.Count == 0 ? null : versions[^1]);
        }
    }

    /// <summary>The differences from version <paramref name="from"/> to version <paramref name="to"/> of <paramref name="gridName"/>; null when either is not stored.</summary>
    public GridDifference? Compare(string gridName, int from, int to) =>
        Find(gridName, from) is { } a && Find(gridName, to) is { } b ? GridComparison.Compare(a.Grid, b.Grid) : null;

    /// <summary>The differences between two grids read from files (the command line's comparison).</summary>
    public static GridDifference Compare(Grid before, Grid after) => GridComparison.Compare(before, after);

    public void Dispose() => _store.Dispose();
}
