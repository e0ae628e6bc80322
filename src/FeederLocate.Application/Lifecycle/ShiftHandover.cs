using FeederLocate.Application.Analysis;
using FeederLocate.Application.Incidents;
using FeederLocate.Application.Switching;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Lifecycle;

/// <summary>A section without supply now, with the name operators use and its customers.</summary>
public sealed record SectionOff(SectionId Id, string Name, int Customers);

/// <summary>
/// One open incident as the outgoing shift hands it over: its line on the board (stage, age, customers off, next
/// step, customer minutes), the sections still off by name, and the open questions: indicators not read yet
/// (no reading, or only unknown), readings marked distrusted, indicators whose reading had expired, switches
/// whose recorded position the evidence doubts (<see cref="SwitchSuspects"/>), and whether the evidence fits no
/// single explanation.
/// </summary>
public sealed record HandoverEntry(
    IncidentLine Line,
    IReadOnlyList<SectionOff> SectionsOff,
    IReadOnlyList<IndicatorId> Unread,
    IReadOnlyList<IndicatorId> Distrusted,
    IReadOnlyList<IndicatorId> Expired,
    string? AnalysisProblem)
{
    public IncidentId Id => Line.State.Id;

    public string GridName => Line.State.GridName;

    /// <summary>Switches probably in the other position than recorded (the ranking's switch suspects), most probable first.</summary>
    public IReadOnlyList<SwitchSuspect> SwitchSuspects { get; init; } = [];
}

/// <summary>
/// The shift handover: every open incident the reader may see, by id, with what is still off, the next step and
/// the open questions. The page, the HTTP interface and the command line all show this one list.
/// </summary>
public sealed class ShiftHandover(IncidentLog log, IncidentAnalysis analysis, TimeProvider clock)
{
    /// <summary>
    /// The open incidents whose grid <paramref name="graphOf"/> finds (by grid name) and <paramref name="visible"/>
    /// allows; an incident of a grid not loaded is listed by <see cref="IncidentsWithoutGrid"/> instead.
    /// </summary>
    public async Task<IReadOnlyList<HandoverEntry>> EntriesAsync(Func<string, NetworkGraph?> graphOf, Func<string, bool>? visible = null)
    {
        ArgumentNullException.ThrowIfNull(graphOf);
        var now = clock.GetUtcNow();
        var entries = new List<HandoverEntry>();
        foreach (var summary in Open(visible))
        {
            if (graphOf(summary.GridName) is { } graph)
            {
                entries.Add(await EntryAsync(graph, log.State(summary.Id), now).ConfigureAwait(false));
            }
        }

        return entries;
    }

    /// <summary>Open incidents on grids that are not loaded: named, so that the handover leaves none out silently.</summary>
    public IReadOnlyList<IncidentSummary> IncidentsWithoutGrid(Func<string, NetworkGraph?> graphOf, Func<string, bool>? visible = null)
    {
        ArgumentNullException.ThrowIfNull(graphOf);
        return [.. Open(visible).Where(s => graphOf(s.GridName) is null)];
    }

    private IEnumerable<IncidentSummary> Open(Func<string, bool>? visible) =>
        log.List().Where(s => s.Status == IncidentStatus.Open && (visible?.Invoke(s.GridName) ?? true)).OrderBy(s => s.Id.Value);

    /// <summary>One incident's handover entry at <paramref name="now"/>.</summary>
    public async Task<HandoverEntry> EntryAsync(NetworkGraph graph, IncidentState state, DateTimeOffset now)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(state);
        var line = await IncidentOverview.LineAsync(graph, state, analysis, now).ConfigureAwait(false);
        var ranking = await analysis.RankAsync(graph, state).ConfigureAwait(false);
        var readings = state.Incident.Indications.ToDictionary(i => i.Indicator);
        var unread = graph.Grid.Indicators
            .Where(i => readings.GetValueOrDefault(i.Id) is not { State: not IndicatorState.Unknown })
            .Select(i => i.Id)
            .OrderBy(i => i.Value, StringComparer.Ordinal)
            .ToList();
        var distrusted = state.Incident.Indications.Where(i => i.Distrusted).Select(i => i.Indicator).OrderBy(i => i.Value, StringComparer.Ordinal).ToList();
        var expired = ranking.Result is { } result ? result.Expired.OrderBy(i => i.Value, StringComparer.Ordinal).ToList() : [];
        return new HandoverEntry(line, SectionsOff(graph, state), unread, distrusted, expired, ranking.Problem)
        {
            SwitchSuspects = ranking.Result is { } r ? r.SwitchSuspects : [],
        };
    }

    /// <summary>The sections with no supply at the incident's switch positions of now (among those the normal network supplies), by name.</summary>
    public static IReadOnlyList<SectionOff> SectionsOff(NetworkGraph graph, IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(graph);
        var grid = graph.Grid;
        if (!graph.TryEnergise(IncidentSwitching.Current(grid, state), out var network, out _) || network is null
            || !graph.TryEnergise(SwitchStates.Normal(grid), out var normal, out _) || normal is null)
        {
            return [];
        }

        var names = Naming.GridNames.Sections(graph);
        return [.. graph.Sections.All
            .Where(s => s.Nodes.Any(n => normal.IsEnergised(n)) && s.Nodes.All(n => !network.IsEnergised(n) || !normal.IsEnergised(n)))
            .Select(s => new SectionOff(s.Id, names[s.Id], s.Nodes.Sum(n => grid.Node(n).Customers)))
            .OrderBy(s => s.Name, StringComparer.Ordinal)];
    }
}
