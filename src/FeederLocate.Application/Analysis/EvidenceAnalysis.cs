using FeederLocate.Core.Evidence;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Application.Analysis;

/// <summary>The ranking and the plan of evidence as given (an incident file, or a logged incident's state); nothing is kept.</summary>
public static class EvidenceAnalysis
{
    /// <summary>Ranks <paramref name="incident"/> with <paramref name="priors"/>; the problem instead when it cannot be ranked.</summary>
    public static RankingOutcome Rank(NetworkGraph graph, Incident incident, RankingPriors priors, IFaultRanker? ranker = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        ArgumentNullException.ThrowIfNull(priors);
        try
        {
            return new RankingOutcome((ranker ?? new CoreFaultRanker()).Rank(graph, incident, priors), null);
        }
        catch (RankingException e)
        {
            return new RankingOutcome(null, e.Message);
        }
    }

    /// <summary>The switching order for the ranking's most likely section; the problem instead when there is none.</summary>
    public static PlanOutcome Plan(NetworkGraph graph, Incident incident, RankingResult ranking, SwitchingOptions? options = null) =>
        SwitchingPlanner.TryPlan(graph, incident, ranking, out var plan, out var problem, options)
            ? new PlanOutcome(plan, null)
            : new PlanOutcome(null, problem);
}
