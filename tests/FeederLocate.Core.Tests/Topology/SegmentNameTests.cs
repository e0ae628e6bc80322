using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Topology;

public class SegmentNameTests
{
    private static (NetworkGraph Graph, SectionNames Sections, SegmentNames Segments) Build(Grid grid)
    {
        var graph = new NetworkGraph(grid);
        var feeders = FeederMap.Build(graph);
        var sections = SectionNames.Build(graph, feeders);
        return (graph, sections, SegmentNames.Build(graph, feeders, sections));
    }

    [Fact]
    public void A_segment_is_named_by_its_section_and_its_place_from_the_supply_side()
    {
        var (_, _, names) = Build(Grids.Sample("solid"));

        // S101 (A1-01 to A1-02) is fed from CB-A1 and feeds S102 (A1-02 to A1-03): one section of two.
        Assert.Equal("A1: CB-A1 → LB-A1-1, part 1 of 2", names[new SegmentId("S101")]);
        Assert.Equal("A1: CB-A1 → LB-A1-1, part 2 of 2", names[new SegmentId("S102")]);
        Assert.Equal("S999", names[new SegmentId("S999")]);
    }

    [Theory]
    [InlineData(300, 3)]
    [InlineData(2_000, 17)]
    public void Every_segment_of_a_generated_grid_has_a_name_of_its_own_that_begins_with_its_sections(int segments, int seed)
    {
        var (graph, sections, names) = Build(SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed)));

        Assert.Equal(graph.Grid.Segments.Length, names.All.Count);
        Assert.Equal(names.All.Count, names.All.Values.Distinct(StringComparer.Ordinal).Count());
        foreach (var segment in graph.Grid.Segments)
        {
            var section = sections[graph.Sections.OfSegment(graph.Grid.SegmentIndex(segment.Id)).Id];
            Assert.StartsWith(section, names[segment.Id], StringComparison.Ordinal);
        }
    }
}
