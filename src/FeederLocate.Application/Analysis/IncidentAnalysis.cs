using FeederLocate.Core.Model;
using BitFaster.Caching;
using BitFaster.Caching.Lru;
using FeederLocate.Application.History;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Analysis;

/// <summary>
/// The ranking of an incident's evidence, with priors learned from the other outcomes of its grid, and the
/// switching order for its most likely section, made from the positions switched before the present plan. A logged incident's results are kept per grid, incident and the
/// last event among the ranking's inputs (the incident's own events and those of every incident of the grid with
/// an outcome); event ids only grow, so any change to an input makes a new key. The cache is bounded (least
/// recently used goes) and shared: concurrent requests for one key wait for one computation, which runs on the
/// thread pool, never on the caller's thread.
/// </summary>
public sealed class IncidentAnalysis
{
    private readonly GridLearning _learning;
    private readonly IFaultRanker _ranker;
    private readonly IAsyncCache<AnalysisKey, RankingAttempt> _rankings;
    private readonly IAsyncCache<AnalysisKey, PlanAttempt> _plans;

    public IncidentAnalysis(GridLearning learning, IFaultRanker ranker, int capacity = 256)
    {
        ArgumentNullException.ThrowIfNull(learning);
        ArgumentNullException.ThrowIfNull(ranker);
        ArgumentOutOfRangeException.ThrowIfLessThan(capacity, 3);
        _learning = learning;
        _ranker = ranker;
        _rankings = new ConcurrentLruBuilder<AnalysisKey, RankingAttempt>().WithCapacity(capacity).AsAsyncCache().WithAtomicGetOrAdd().Build();
        _plans = new ConcurrentLruBuilder<AnalysisKey, PlanAttempt>().WithCapacity(capacity).AsAsyncCache().WithAtomicGetOrAdd().Build();
    }

    /// <summary>The ranking of a logged incident as it stands in <paramref name="state"/>.</summary>
    public Task<RankingAttempt> RankAsync(NetworkGraph graph, IncidentState state)
    {
        var (key, outcomes) = KeyOf(graph, state);
        return RankAsync(key, graph, state, outcomes);
    }

    /// <summary>The switching order for the ranking's most likely section of a logged incident.</summary>
    public Task<PlanAttempt> PlanAsync(NetworkGraph graph, IncidentState state)
    {
        var (key, outcomes) = KeyOf(graph, state);
        return PlanAsync(key, graph, state, outcomes);
    }

    /// <summary>
    /// The switching order for the ranking's most likely section when it is already planned; null when it is not
    /// (nothing is started: a caller that shows the suspects first plans after).
    /// </summary>
    public PlanAttempt? Planned(NetworkGraph graph, IncidentState state)
    {
        var (key, _) = KeyOf(graph, state);
        return _plans.TryGet(key, out var plan) ? plan : null;
    }

    /// <summary>
    /// The switching order assuming the fault lies in <paramref name="section"/>; the ranking's most likely
    /// section (and the cached plan) when null.
    /// </summary>
    public async Task<PlanAttempt> PlanForAsync(NetworkGraph graph, IncidentState state, SectionId? section)
    {
        if (section is not { } chosen)
        {
            return await PlanAsync(graph, state).ConfigureAwait(false);
        }

        var ranking = await RankAsync(graph, state).ConfigureAwait(false);
        return ranking.Result is { } result
            ? await Task.Run(() => EvidenceAnalysis.PlanFor(graph, state.Incident, result, chosen)).ConfigureAwait(false)
            : new PlanAttempt(null, ranking.Problem);
    }

    /// <summary>
    /// The incident's return to normal: from the switch positions as carried out before the return
    /// (<see cref="Switching.IncidentSwitching.BeforeReturn"/>), with the clearance of the present plan's earths and
    /// locks that were ticked as put on. It does not change while its own steps are ticked, so their numbers hold.
    /// </summary>
    public async Task<ReturnAttempt> ReturnAsync(NetworkGraph graph, IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(state);
        var plan = await PlanAsync(graph, state).ConfigureAwait(false);
        var start = Switching.IncidentSwitching.BeforeReturn(graph.Grid, state);
        // The clearance takes off only the earths and locks whose steps were ticked as put on.
        var placed = plan.Plan is { } found
            ? found with
            {
                Steps = [.. found.Steps.Where(s => s.Action is not (Core.Switching.StepAction.Earth or Core.Switching.StepAction.Lock)
                    || state.CompletedSteps.Any(d => d.Step.Order == s.Order && d.Step.Action == Switching.CheckedSwitching.ActionName(s.Action)))],
            }
            : null;
        return await Task.Run(() =>
        {
            try
            {
                return new ReturnAttempt(Core.Switching.SwitchingPlanner.PlanReturnFrom(graph, start, placed), null);
            }
            catch (Core.Switching.PlanningException e)
            {
                return new ReturnAttempt(null, e.Message);
            }
        }).ConfigureAwait(false);
    }

    /// <summary>The ranking and the plan of a logged incident together.</summary>
    public async Task<IncidentAnalysisResult> AnalyseAsync(NetworkGraph graph, IncidentState state)
    {
        var (key, outcomes) = KeyOf(graph, state);
        var ranking = await RankAsync(key, graph, state, outcomes).ConfigureAwait(false);
        var plan = await PlanAsync(key, graph, state, outcomes).ConfigureAwait(false);
        return new IncidentAnalysisResult(ranking, plan);
    }

    private (AnalysisKey Key, GridOutcomes Outcomes) KeyOf(NetworkGraph graph, IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(state);
        var outcomes = _learning.Outcomes(graph);
        return (new AnalysisKey(graph, state.GridVersion, state.Id, Math.Max(state.LastEvent.Value, outcomes.Through)), outcomes);
    }

    private async Task<RankingAttempt> RankAsync(AnalysisKey key, NetworkGraph graph, IncidentState state, GridOutcomes outcomes) =>
        await _rankings.GetOrAddAsync(key, _ => Task.Run(() => EvidenceAnalysis.Rank(graph, state.Incident, _learning.Priors(graph, outcomes, state.Id), _ranker))).ConfigureAwait(false);

    private async Task<PlanAttempt> PlanAsync(AnalysisKey key, NetworkGraph graph, IncidentState state, GridOutcomes outcomes) =>
        await _plans.GetOrAddAsync(key, async _ =>
        {
            var ranking = await RankAsync(key, graph, state, outcomes).ConfigureAwait(false);
            return ranking.Result is { } result
                ? await Task.Run(() => EvidenceAnalysis.Plan(graph, state.PlanBasis, result)).ConfigureAwait(false)
                : new PlanAttempt(null, ranking.Problem);
        }).ConfigureAwait(false);

    /// <summary>
    /// The grid (as read: each stored version is its own graph), the version the incident is pinned to, the
    /// incident, and the last event among the inputs (a move to another version is an event too).
    /// </summary>
    private readonly record struct AnalysisKey(NetworkGraph Graph, int GridVersion, IncidentId Incident, long InputsThrough);
}
