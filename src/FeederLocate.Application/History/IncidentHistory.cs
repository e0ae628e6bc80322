using FeederLocate.Application.Analysis;
using FeederLocate.Application.Incidents;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.History;

/// <summary>How the ranking did on one incident: where the confirmed section stood.</summary>
public sealed record IncidentReview(IncidentSummary Summary, SectionId? ConfirmedSection, int? RankOfConfirmedSection);

/// <summary>
/// The history of a grid: incidents reviewed, indicator performance and faults per section, and the logged
/// outcomes the learning skips (<see cref="GridLearning.Unusable"/>).
/// </summary>
public sealed record GridHistory(
    IReadOnlyList<IncidentReview> Incidents,
    IReadOnlyList<IndicatorReliability> Indicators,
    IReadOnlyDictionary<SectionId, int> FaultsPerSection,
    IReadOnlyList<UnusableOutcome> Unusable)
{
    /// <summary>Everything learned from the grid's history: chosen prior strengths, skipped outcomes.</summary>
    public LearnedPriors? Learned { get; init; }
}

/// <summary>
/// A grid's history from the incident log: each confirmed incident ranked as the ranking would have ranked it
/// (its own outcome left out of the priors), what was learned, and the confirmed faults per section.
/// </summary>
public sealed class IncidentHistory(IncidentLog log, GridLearning learning, IncidentAnalysis analysis)
{
    public async Task<GridHistory> ForAsync(NetworkGraph graph)
    {
        ArgumentNullException.ThrowIfNull(graph);
        var grid = graph.Grid;
        var reviews = new List<IncidentReview>();
        foreach (var summary in log.List().Where(s => s.GridName == grid.Name))
        {
            SectionId? section = null;
            int? rank = null;
            if (summary.ConfirmedSegment is { } segment && grid.HasSegment(segment))
            {
                section = graph.Sections.OfSegment(grid.SegmentIndex(segment)).Id;
                var ranking = (await analysis.RankAsync(graph, log.State(summary.Id)).ConfigureAwait(false)).Result;
                var position = ranking?.Sections.Select(s => s.Id).ToList().IndexOf(section.Value) ?? -1;
                rank = position >= 0 ? position + 1 : null;
            }

            reviews.Add(new IncidentReview(summary, section, rank));
        }

        var perSection = learning.OutcomesForLearning(graph)
            .GroupBy(o => graph.Sections.OfSegment(grid.SegmentIndex(o.Segment)).Id)
            .ToDictionary(g => g.Key, g => g.Count());
        var learned = learning.Learned(graph);
        return new GridHistory(reviews, [.. learned.Indicators.Indicators], perSection, learning.Unusable(graph)) { Learned = learned };
    }
}
