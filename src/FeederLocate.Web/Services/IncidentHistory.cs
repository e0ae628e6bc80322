using FeederLocate.Core.Learning;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Web.Services;

/// <summary>How the ranking did on one incident: where the confirmed section stood.</summary>
public sealed record IncidentReview(IncidentSummary Summary, SectionId? ConfirmedSection, int? RankOfConfirmedSection);

/// <summary>The history of a grid: incidents reviewed, indicator performance and faults per section.</summary>
public sealed record GridHistory(
    LoadedGrid Grid,
    IReadOnlyList<IncidentReview> Incidents,
    IReadOnlyList<IndicatorReliability> Indicators,
    IReadOnlyDictionary<SectionId, int> FaultsPerSection)
{
    /// <summary>Everything learned from the grid's history: chosen prior strengths, skipped outcomes.</summary>
    public LearnedPriors? Learned { get; init; }
}

/// <summary>Builds a grid's history from the incident log.</summary>
public sealed class IncidentHistory(IncidentBoard board, IncidentAnalysis analysis)
{
    public GridHistory For(LoadedGrid grid)
    {
        ArgumentNullException.ThrowIfNull(grid);
        var reviews = new List<IncidentReview>();
        foreach (var summary in board.List().Where(s => s.GridName == grid.Name))
        {
            SectionId? section = null;
            int? rank = null;
            if (summary.ConfirmedSegment is { } segment && grid.Grid.HasSegment(segment))
            {
                section = grid.Graph.Sections.OfSegment(grid.Grid.SegmentIndex(segment)).Id;
                var ranking = analysis.Rank(grid, board.State(summary.Id)).Result;
                var position = ranking?.Sections.Select(s => s.Id).ToList().IndexOf(section.Value) ?? -1;
                rank = position >= 0 ? position + 1 : null;
            }

            reviews.Add(new IncidentReview(summary, section, rank));
        }

        var outcomes = board.Outcomes(grid.Name)
            .Where(o => grid.Grid.HasSegment(o.ConfirmedSegment))
            .Select(o => new ConfirmedIncident(o.Incident, o.ConfirmedSegment))
            .ToList();
        var learned = analysis.Learned(grid);
        var perSection = outcomes
            .GroupBy(o => grid.Graph.Sections.OfSegment(grid.Grid.SegmentIndex(o.Segment)).Id)
            .ToDictionary(g => g.Key, g => g.Count());
        return new GridHistory(grid, reviews, [.. learned.Indicators.Indicators], perSection) { Learned = learned };
    }
}
