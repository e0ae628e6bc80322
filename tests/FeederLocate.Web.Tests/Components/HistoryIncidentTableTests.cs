using Bunit;
using FeederLocate.Application.History;
using FeederLocate.Application.Naming;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Incidents;
using FeederLocate.Web.Components.History;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

/// <summary>The History page's incidents name the confirmed segment and its section as operators do; the ids are tooltips.</summary>
public class HistoryIncidentTableTests : ComponentTest
{
    private static readonly DateTimeOffset At = new(2026, 3, 1, 18, 0, 0, TimeSpan.Zero);

    public static TheoryData<string> Schemes() => ["isolated", "resonant", "solid", "impedance"];

    [Theory]
    [MemberData(nameof(Schemes))]
    public void The_confirmed_segment_and_section_are_shown_by_name_with_the_ids_as_tooltips(string scheme)
    {
        var graph = new NetworkGraph(SampleGrids.Grid(scheme));
        // A section of several segments: its segment's name says which part of the section it is.
        var section = graph.Sections.All.First(s => s.Segments.Length > 1);
        var segment = section.Segments[^1];
        var review = new IncidentReview(
            new IncidentSummary(new IncidentId(5), graph.Grid.Name, At, IncidentStatus.Closed, FaultType.LG, segment, "tree", null, 9),
            section.Id, 2);

        var cut = Render<HistoryIncidentTable>(p => p
            .Add(c => c.Incidents, [review])
            .Add(c => c.SectionNames, GridNames.Sections(graph))
            .Add(c => c.SegmentNames, GridNames.Segments(graph)));

        var segmentCell = cut.Find("[data-testid=confirmed-segment-5]");
        var sectionCell = cut.Find("[data-testid=confirmed-section-5]");
        Assert.Equal(GridNames.Segments(graph)[segment], segmentCell.TextContent);
        Assert.Equal(segment.Value, segmentCell.GetAttribute("title"));
        Assert.Equal(GridNames.Sections(graph)[section.Id], sectionCell.TextContent);
        Assert.Equal(section.Id.Value, sectionCell.GetAttribute("title"));
        Assert.DoesNotContain(section.Id.Value, cut.Find("tbody").TextContent, StringComparison.Ordinal);
        Assert.Contains("part ", segmentCell.TextContent, StringComparison.Ordinal);
        Assert.Equal("2", cut.Find("[data-testid=rank-5]").TextContent);
    }

    [Fact]
    public void An_incident_without_a_fault_found_says_so_and_one_without_an_outcome_shows_a_dash()
    {
        var none = new IncidentSummary(new IncidentId(6), "g", At, IncidentStatus.Closed, null, null, null, null, 4) { NoFaultFound = true, Transient = true };
        var open = new IncidentSummary(new IncidentId(7), "g", At, IncidentStatus.Open, null, null, null, null, 1);

        var cut = Render<HistoryIncidentTable>(p => p.Add(c => c.Incidents, [new IncidentReview(none, null, null), new IncidentReview(open, null, null)]));

        Assert.Equal("none found (transient)", cut.Find("[data-testid=confirmed-segment-6]").TextContent);
        Assert.Equal("–", cut.Find("[data-testid=confirmed-segment-7]").TextContent);
        Assert.Equal("–", cut.Find("[data-testid=confirmed-section-7]").TextContent);
    }
}
