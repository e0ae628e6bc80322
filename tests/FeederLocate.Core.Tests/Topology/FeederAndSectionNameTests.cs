using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Topology;

public class FeederAndSectionNameTests
{
    private static (NetworkGraph Graph, FeederMap Feeders, SectionNames Names) Build(Grid grid)
    {
        var graph = new NetworkGraph(grid);
        var feeders = FeederMap.Build(graph);
        return (graph, feeders, SectionNames.Build(graph, feeders));
    }

    private static string NameOfSectionWith(NetworkGraph graph, SectionNames names, string segment) =>
        names[graph.Sections.OfSegment(graph.Grid.SegmentIndex(new SegmentId(segment))).Id];

    [Fact]
    public void The_sample_grid_has_one_feeder_per_breaker_named_without_the_kind_prefix()
    {
        var (_, feeders, _) = Build(Grids.Sample("solid"));

        Assert.Equal(["A1", "A2", "B1", "B2"], feeders.All.Select(f => f.Name));
        Assert.Equal(["CB-A1", "CB-A2", "CB-B1", "CB-B2"], feeders.All.Select(f => f.HeadId));
    }

    [Fact]
    public void A_section_is_named_by_its_feeder_its_supply_device_and_its_far_devices()
    {
        var (graph, _, names) = Build(Grids.Sample("solid"));

        Assert.Equal("A1: CB-A1 → LB-A1-1", NameOfSectionWith(graph, names, "S101"));
        Assert.Equal("A1: LB-A1-1 → DS-A1-2, LB-A1-3", NameOfSectionWith(graph, names, "S103"));
        // Closed devices come before the tie that also bounds the stretch.
        Assert.Equal("A1: LB-A1-4 → FU-A1-6, NO-A1-B1", NameOfSectionWith(graph, names, "S110"));
    }

    [Fact]
    public void A_name_without_a_prefix_is_the_id_itself()
    {
        Assert.Equal("A1", FeederMap.NameOf("CB-A1"));
        Assert.Equal("F12-B", FeederMap.NameOf("CB-F12-B"));
        Assert.Equal("BRK7", FeederMap.NameOf("BRK7"));
        Assert.Equal("X-", FeederMap.NameOf("X-"));
    }

    [Theory]
    [InlineData(GroundingScheme.Isolated, 400, 3)]
    [InlineData(GroundingScheme.Resonant, 2_000, 2)]
    [InlineData(GroundingScheme.Solid, 1_500, 1)]
    [InlineData(GroundingScheme.Impedance, 900, 4)]
    public void Every_section_of_a_generated_grid_has_its_own_name_starting_with_its_feeder(GroundingScheme scheme, int segments, int substations)
    {
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(segments, Seed: 7, scheme, Substations: substations, SegmentsPerFeeder: 45));
        var (graph, feeders, names) = Build(grid);

        Assert.Equal(graph.Sections.All.Length, names.All.Values.Distinct(StringComparer.Ordinal).Count());
        foreach (var section in graph.Sections.All)
        {
            var feeder = feeders.OfSegment(grid.SegmentIndex(section.Segments[0]));
            Assert.NotNull(feeder);
            Assert.StartsWith($"{feeder.Name}: ", names[section.Id], StringComparison.Ordinal);
        }

        Assert.Equal(feeders.All.Sum(f => f.Nodes.Length), grid.Nodes.Length - grid.Substations.Length);
    }
}
