using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.History;

/// <summary>The one place a logged outcome becomes a confirmed incident for learning.</summary>
public static class LearningOutcomes
{
    /// <summary>
    /// The outcomes whose confirmed segment is in <paramref name="grid"/> (a grid of the same name may have been
    /// edited since), each as its evidence stood when last updated with the confirmed segment.
    /// </summary>
    public static IReadOnlyList<Outcome> Of(Grid grid, IEnumerable<IncidentOutcome> outcomes)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(outcomes);
        return [.. outcomes.Where(o => grid.HasSegment(o.ConfirmedSegment)).Select(o => new Outcome(o.Incident, o.ConfirmedSegment))];
    }
}
