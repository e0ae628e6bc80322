using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.History;

/// <summary>The one place a logged outcome becomes a confirmed incident for learning.</summary>
public static class ConfirmedIncidents
{
    /// <summary>
    /// The outcomes whose confirmed segment is in <paramref name="grid"/> (a grid of the same name may have been
    /// edited since), each as its evidence stood when last updated with the confirmed segment.
    /// </summary>
    public static IReadOnlyList<ConfirmedIncident> Of(Grid grid, IEnumerable<RecordedOutcome> outcomes)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(outcomes);
        return [.. outcomes.Where(o => grid.HasSegment(o.ConfirmedSegment)).Select(o => new ConfirmedIncident(o.Incident, o.ConfirmedSegment))];
    }
}
