using FeederLocate.Core.Topology;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Errors;

/// <summary>
/// Switch states that no radial network explains (a loop, or two substations in parallel): no ranking or plan
/// could use them, so they are not logged, nor is an outcome on them.
/// </summary>
public sealed class EvidenceNotRadialException(IncidentId incident, TopologyProblem problem)
    : IncidentStoreException(incident, $"incident {incident}: {problem.Message}; FeederLocate models radial operation only: correct the switch states first")
{
    public TopologyProblem Problem { get; } = problem;
}
