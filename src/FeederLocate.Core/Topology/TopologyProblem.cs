using System.Collections.Immutable;

namespace FeederLocate.Core.Topology;

/// <summary>Why a switching state gives no radial network: a loop or two substations paralleled, with the elements involved.</summary>
public sealed record TopologyProblem(string Message, ImmutableArray<string> Elements)
{
    public override string ToString() => Message;
}

/// <summary>Thrown where a switching state closes a loop or parallels two substations.</summary>
public sealed class TopologyException(TopologyProblem problem) : Exception(problem.Message)
{
    public TopologyProblem Problem { get; } = problem;
}
