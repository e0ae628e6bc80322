using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Application.Analysis;

/// <summary>The ranking and the plan of evidence as given (an incident file, or a logged incident's state); nothing is kept.</summary>
public static class EvidenceAnalysis
{
    /// <summary>Ranks <paramref name="incident"/> with <paramref name="priors"/>; the problem instead when it cannot be ranked.</summary>
    public static RankingAttempt Rank(NetworkGraph graph, Incident incident, RankingPriors priors, IFaultRanker? ranker = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        ArgumentNullException.ThrowIfNull(priors);
        return FaultRanking.Refusal(graph, incident) is { } problem
            ? new RankingAttempt(null, problem)
            : new RankingAttempt((ranker ?? new CoreFaultRanker()).Rank(graph, incident, priors), null);
    }

    /// <summary>The switching order for the ranking's most likely section; the problem instead when there is none.</summary>
    public static PlanAttempt Plan(NetworkGraph graph, Incident incident, RankingResult ranking, SwitchingOptions? options = null) =>
        SwitchingPlanner.TryPlan(graph, incident, ranking, out var plan, out var problem, options)
            ? new PlanAttempt(plan, null)
            : new PlanAttempt(null, problem);

    /// <summary>
    /// The switching order assuming the fault lies in <paramref name="section"/> (an engineer's choice, not the
    /// ranking's); the problem instead when the section is unknown or cannot be isolated.
    /// </summary>
    public static PlanAttempt PlanFor(NetworkGraph graph, Incident incident, RankingResult ranking, SectionId section, SwitchingOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        if (!graph.Sections.Contains(section))
        {
            return new PlanAttempt(null, $"section {section} is not a section of grid '{graph.Grid.Name}'");
        }

        try
        {
            return new PlanAttempt(SwitchingPlanner.Plan(graph, incident, section, ranking, options), null);
        }
        catch (PlanningException e)
        {
            return new PlanAttempt(null, e.Message);
        }
    }

    /// <summary>The return to normal after the repair, from the state <paramref name="plan"/> leaves; the problem instead when there is none.</summary>
    public static ReturnAttempt Return(NetworkGraph graph, Incident incident, SwitchingPlan plan, SwitchingOptions? options = null)
    {
        try
        {
            return new ReturnAttempt(SwitchingPlanner.PlanReturn(graph, incident, plan, options), null);
        }
        catch (PlanningException e)
        {
            return new ReturnAttempt(null, e.Message);
        }
    }
}
