using FeederLocate.Core.Evidence;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;

namespace FeederLocate.Application.Analysis;

/// <summary>The ranking as the analysis calls it: one seam, so how often it runs can be counted.</summary>
public interface IFaultRanker
{
    /// <summary>Ranks the incident's evidence; throws <see cref="RankingException"/> when it cannot.</summary>
    RankingResult Rank(NetworkGraph graph, Incident incident, RankingPriors priors);
}

/// <summary>The core's ranking with its default options.</summary>
public sealed class CoreFaultRanker : IFaultRanker
{
    public RankingResult Rank(NetworkGraph graph, Incident incident, RankingPriors priors) =>
        FaultRanking.Rank(graph, incident, priors: priors);
}
