using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Topology;

public class RadialCheckTests
{
    [Fact]
    public void Partition_numbers_parts_by_their_lowest_node()
    {
        var partition = NodePartition.Of(5, [(3, 4), (2, 0)]);

        Assert.Equal([[0, 2], [1], [3, 4]], partition.Parts.Select(p => p.ToArray()));
        Assert.Equal(2, partition.PartOf(4));
        Assert.True(partition.AreConnected(0, 2));
        Assert.False(partition.AreConnected(1, 2));
    }

    [Fact]
    public void Every_section_lies_in_one_switch_free_part_and_no_two_sections_share_one()
    {
        var graph = new NetworkGraph(Grids.Sample("resonant"));
        var grid = graph.Grid;

        var partsOfSections = graph.Sections.All
            .Select(s => s.Nodes.Select(n => graph.SwitchFreeParts.PartOf(grid.NodeIndex(n))).Distinct().ToList())
            .ToList();

        Assert.All(partsOfSections, parts => Assert.Single(parts));
        Assert.Equal(partsOfSections.Count, partsOfSections.Select(p => p[0]).Distinct().Count());
    }

    [Theory]
    [InlineData(10, 3, GroundingScheme.Isolated)]
    [InlineData(150, 11, GroundingScheme.Solid)]
    public void Normal_state_of_a_generated_grid_is_radial_and_feeds_what_the_energised_view_feeds(int segments, int seed, GroundingScheme scheme)
    {
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed, scheme));
        var graph = new NetworkGraph(grid);
        var states = SwitchStates.Normal(grid);

        var check = RadialCheck.Of(graph, states);
        var network = graph.Energise(states);

        Assert.True(check.IsRadial);
        Assert.Empty(check.Loops);
        Assert.Empty(check.Parallelings);
        Assert.All(Enumerable.Range(0, grid.Nodes.Length), v => Assert.Equal(network.IsEnergised(v), check.IsFed(v)));
    }

    [Fact]
    public void Closing_a_tie_within_one_substation_gives_one_fed_loop_naming_its_elements()
    {
        var grid = Grids.Sample("solid");
        var graph = new NetworkGraph(grid);

        var check = RadialCheck.Of(graph, SwitchStates.Normal(grid).With(new SwitchId("NO-A1-A2"), SwitchPosition.Closed));

        var loop = Assert.Single(check.Loops);
        Assert.True(loop.Fed);
        Assert.False(check.IsRadial);

        // Bus A –CB-A1– … – A1-19 –NO-A1-A2– A2-10 – … –CB-A2– bus A (from the sample grid's data).
        string[] expected =
        [
            "switch CB-A1", "segment S101", "segment S102", "switch LB-A1-1", "segment S103", "segment S104", "switch LB-A1-3",
            "segment S108", "switch DS-A1-5", "segment S112", "segment S113", "switch NO-A1-A2",
            "segment S207", "segment S206", "switch LB-A2-2", "segment S204", "switch LB-A2-1", "segment S202", "segment S201", "switch CB-A2",
        ];
        Assert.Equal(expected.Order(StringComparer.Ordinal), loop.Path.Append(loop.Closing).Select(graph.Describe).Order(StringComparer.Ordinal));
    }

    [Fact]
    public void Closing_a_tie_between_substations_parallels_them_through_the_tie()
    {
        var grid = Grids.Sample("solid");
        var graph = new NetworkGraph(grid);

        var check = RadialCheck.Of(graph, SwitchStates.Normal(grid).With(new SwitchId("NO-A1-B1"), SwitchPosition.Closed));

        var paralleling = Assert.Single(check.Parallelings);
        Assert.Empty(check.Loops);
        Assert.Equal((new SubstationId("A"), new SubstationId("B")), (grid.Substations[paralleling.First].Id, grid.Substations[paralleling.Second].Id));
        Assert.Contains("switch NO-A1-B1", paralleling.Path.Select(graph.Describe));

        // The path runs from bus A to bus B: its first element touches bus A, its last bus B.
        var busA = grid.NodeIndex(grid.Substations[paralleling.First].BusNode);
        var busB = grid.NodeIndex(grid.Substations[paralleling.Second].BusNode);
        var (firstFrom, firstTo) = graph.EndsOf(paralleling.Path[0]);
        var (lastFrom, lastTo) = graph.EndsOf(paralleling.Path[^1]);
        Assert.True(firstFrom == busA || firstTo == busA);
        Assert.True(lastFrom == busB || lastTo == busB);
    }

    [Fact]
    public void A_loop_in_a_part_no_bus_reaches_is_reported_unfed_and_leaves_the_network_radial()
    {
        // Tiny Fen plus an island X1 –X-S1– X2 –X-S2– X1 (invented for this test): a loop, but dead.
        var tiny = Grids.TinyFen("resonant");
        var type = tiny.LineTypes[0].Id;
        var grid = Grid.Create(tiny.Name, tiny.FrequencyHz, tiny.LineTypes, tiny.Substations,
            tiny.Nodes.Append(new Node(new NodeId("X1"))).Append(new Node(new NodeId("X2"))),
            tiny.Segments.Append(new Segment(new SegmentId("X-S1"), new NodeId("X1"), new NodeId("X2"), type, 1))
                .Append(new Segment(new SegmentId("X-S2"), new NodeId("X2"), new NodeId("X1"), type, 1)),
            tiny.Switches, tiny.Indicators);
        var graph = new NetworkGraph(grid);

        var check = RadialCheck.Of(graph, SwitchStates.Normal(grid));

        var loop = Assert.Single(check.Loops);
        Assert.False(loop.Fed);
        Assert.Equal("segment X-S2", graph.Describe(loop.Closing));
        Assert.Equal(["segment X-S1"], loop.Path.Select(graph.Describe));
        Assert.True(check.IsRadial);
        Assert.False(check.IsFed(grid.NodeIndex(new NodeId("X1"))));
        Assert.True(graph.TryEnergise(SwitchStates.Normal(grid), out _, out var problem), problem?.Message);
    }
}
