using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Topology;

public class TopologyTests
{
    // ---- Tiny Fen: bus – CB1 – N1 –S1– N2 –LB2– N3 –S2– N4, and N2 –S3– N5 ----

    [Fact]
    public void Normal_state_feeds_every_tiny_fen_node_from_its_substation()
    {
        var grid = Grids.TinyFen("resonant");
        var network = Grids.Normal(grid);

        Assert.All(grid.Nodes, n => Assert.Equal(new SubstationId("FEN"), network.SubstationOf(n.Id)?.Id));
        Assert.All(grid.Segments, s => Assert.True(network.IsSegmentEnergised(s.Id), $"{s.Id} is dead"));
        Assert.Equal(grid.NodeIndex(new NodeId("FEN-BUS")), network.FeedOrder[0]);
    }

    [Fact]
    public void Opening_LB2_leaves_N3_and_N4_dead()
    {
        var grid = Grids.TinyFen("resonant");
        var states = SwitchStates.Normal(grid).With(new SwitchId("LB2"), SwitchPosition.Open);

        var network = new NetworkGraph(grid).Energise(states);

        Assert.False(network.IsEnergised(new NodeId("N3")));
        Assert.False(network.IsEnergised(new NodeId("N4")));
        Assert.Null(network.SubstationOf(new NodeId("N4")));
        Assert.False(network.IsSegmentEnergised(new SegmentId("S2")));
        Assert.Equal(-1, network.SuppliedEndOf(grid.SegmentIndex(new SegmentId("S2"))));
        Assert.Empty(network.PathFromSource(new NodeId("N4")));
        Assert.Empty(network.ForwardRegion(grid.Indicator(new IndicatorId("FI2"))));
        foreach (var live in new[] { "FEN-BUS", "N1", "N2", "N5" })
        {
            Assert.True(network.IsEnergised(new NodeId(live)), $"{live} is dead");
        }

        Assert.Equal(new Dictionary<SwitchId, SwitchPosition> { [new SwitchId("LB2")] = SwitchPosition.Open }, states.Deviations());
    }

    [Fact]
    public void Path_from_source_lists_the_edges_in_feeding_order()
    {
        var grid = Grids.TinyFen("resonant");
        var graph = new NetworkGraph(grid);
        var network = graph.Energise(SwitchStates.Normal(grid));

        Assert.Equal(["switch CB1", "segment S1", "switch LB2", "segment S2"], network.PathFromSource(new NodeId("N4")).Select(graph.Describe));
        Assert.Equal(["switch CB1", "segment S1", "segment S3"], network.PathFromSource(new NodeId("N5")).Select(graph.Describe));
        Assert.Empty(network.PathFromSource(new NodeId("FEN-BUS")));
    }

    [Fact]
    public void Tiny_fen_has_two_sections_bounded_by_its_switches()
    {
        var sections = new NetworkGraph(Grids.TinyFen("resonant")).Sections;

        Assert.Equal(2, sections.All.Length);
        var first = sections.All.Single(s => s.Segments.Contains(new SegmentId("S1")));
        var second = sections.All.Single(s => s.Segments.Contains(new SegmentId("S2")));
        Assert.Equal(["S1", "S3"], first.Segments.Select(s => s.Value).Order(StringComparer.Ordinal));
        Assert.Equal(["S2"], second.Segments.Select(s => s.Value));
        Assert.Equal(["CB1", "LB2"], first.BoundarySwitches.Select(s => s.Value).Order(StringComparer.Ordinal));
        Assert.Equal(["LB2"], second.BoundarySwitches.Select(s => s.Value));
        Assert.Equal(["N1", "N2", "N5"], first.Nodes.Select(n => n.Value).Order(StringComparer.Ordinal));
        Assert.Equal(7.0, first.LengthKm, 1e-12);
        Assert.Equal(6.0, second.LengthKm, 1e-12);
        Assert.Same(first, sections[first.Id]);
        Assert.Equal(first.Id, sections.OfSegment(2).Id);
    }

    [Theory]
    [InlineData("FI1", new[] { "S1", "S2", "S3" })]
    [InlineData("FI2", new[] { "S2" })]
    [InlineData("FI3", new[] { "S3" })]
    public void Forward_region_of_an_indicator_is_its_segment_and_all_beyond(string indicator, string[] segments)
    {
        var grid = Grids.TinyFen("resonant");
        var network = Grids.Normal(grid);

        var region = network.ForwardRegion(grid.Indicator(new IndicatorId(indicator)));

        Assert.Equal(segments, region.Select(s => s.Value).Order(StringComparer.Ordinal));
        Assert.True(network.FacesAwayFromSource(grid.Indicator(new IndicatorId(indicator))));
    }

    [Theory]
    [InlineData("S1", "N2", new[] { "S1" })]
    [InlineData("S2", "N4", new[] { "S1", "S2", "S3" })]
    [InlineData("S3", "N5", new[] { "S1", "S2", "S3" })]
    public void Forward_region_of_an_indicator_facing_the_source_is_its_segment_and_everything_not_beyond_it(string segment, string node, string[] segments)
    {
        var grid = Grids.TinyFen("resonant");
        var network = Grids.Normal(grid);
        var facingSource = new Indicator(new IndicatorId("X"), new SegmentId(segment), new NodeId(node), null, 5, true, true);

        Assert.False(network.FacesAwayFromSource(facingSource));
        Assert.Equal(segments, network.ForwardRegion(facingSource).Select(s => s.Value).Order(StringComparer.Ordinal));
    }

    // ---- sample grid ----

    [Fact]
    public void Sample_grid_has_the_sections_its_readme_describes()
    {
        var sections = new NetworkGraph(Grids.Sample("solid")).Sections;
        Section Of(string segment) => sections.All.Single(s => s.Segments.Contains(new SegmentId(segment)));

        Assert.Equal(20, sections.All.Length);
        Assert.Equal(["S110", "S111"], Of("S110").Segments.Select(s => s.Value));
        Assert.Equal(["FU-A1-6", "LB-A1-4", "NO-A1-B1"], Of("S110").BoundarySwitches.Select(s => s.Value).Order(StringComparer.Ordinal));
        Assert.Equal(["S114", "S115"], Of("S114").Segments.Select(s => s.Value));
        Assert.Equal(["FU-A1-6"], Of("S114").BoundarySwitches.Select(s => s.Value));
        Assert.Equal(["S305", "S306", "S307"], Of("S305").Segments.Select(s => s.Value));
        Assert.Equal(3.5, Of("S110").LengthKm, 1e-9);
    }

    [Fact]
    public void Sample_grid_feeds_each_feeder_from_its_own_substation()
    {
        var network = Grids.Normal(Grids.Sample("solid"));

        Assert.Equal(new SubstationId("A"), network.SubstationOf(new NodeId("A1-16"))!.Id);
        Assert.Equal(new SubstationId("A"), network.SubstationOf(new NodeId("A2-15"))!.Id);
        Assert.Equal(new SubstationId("B"), network.SubstationOf(new NodeId("B1-13"))!.Id);
        Assert.Equal(new SubstationId("B"), network.SubstationOf(new NodeId("B2-07"))!.Id);
    }

    [Fact]
    public void Incident_switch_states_feed_the_tail_of_A1_from_B1_through_the_closed_tie()
    {
        var grid = Grids.Sample("solid");
        var incident = IncidentReader.Parse(RepositoryFiles.Read("sample-grid", "incidents", "solid-ll-a1-tail-fed-from-b1.incident.json"), grid).ValueOrThrow();
        var graph = new NetworkGraph(grid);

        var network = graph.Energise(SwitchStates.AtFaultTime(grid, incident));

        // LB-A1-4 open, NO-A1-B1 closed: A1-14 … A1-16 and the fused spur behind FU-A1-6 hang off B1-13.
        foreach (var node in new[] { "A1-14", "A1-15", "A1-16", "A1-20", "A1-21", "A1-22" })
        {
            Assert.Equal(new SubstationId("B"), network.SubstationOf(new NodeId(node))?.Id);
        }

        Assert.Equal(new SubstationId("A"), network.SubstationOf(new NodeId("A1-13"))?.Id);

        // S110 runs from A1-14 to A1-15 and is now supplied from its `to` end.
        var s110 = grid.SegmentIndex(new SegmentId("S110"));
        Assert.Equal(grid.NodeIndex(new NodeId("A1-15")), network.SuppliedEndOf(s110));
        Assert.Equal(grid.NodeIndex(new NodeId("A1-14")), network.FarEndOf(s110));
        Assert.Equal(grid.NodeIndex(new NodeId("A1-16")), network.SuppliedEndOf(grid.SegmentIndex(new SegmentId("S111"))));

        var path = network.PathFromSource(new NodeId("A1-14")).Select(graph.Describe).ToList();
        Assert.Equal("switch CB-B1", path[0]);
        Assert.Equal(["switch NO-A1-B1", "segment S111", "segment S110"], path[^3..]);

        Assert.True(network.FacesAwayFromSource(grid.Indicator(new IndicatorId("FPI-A1-16"))));
        Assert.False(network.FacesAwayFromSource(grid.Indicator(new IndicatorId("FPI-A1-14"))));
        var behindA114 = network.ForwardRegion(grid.Indicator(new IndicatorId("FPI-A1-14")));
        Assert.Contains(new SegmentId("S110"), behindA114);
        Assert.Contains(new SegmentId("S301"), behindA114);
        Assert.DoesNotContain(new SegmentId("S109"), behindA114);
    }

    [Fact]
    public void Tripped_recloser_leaves_B1_beyond_it_and_the_fed_tail_of_A1_dead()
    {
        var grid = Grids.Sample("solid");
        var incident = IncidentReader.Parse(RepositoryFiles.Read("sample-grid", "incidents", "solid-ll-a1-tail-fed-from-b1.incident.json"), grid).ValueOrThrow();

        var network = new NetworkGraph(grid).Energise(SwitchStates.AfterTrip(grid, incident));

        Assert.True(network.IsSegmentEnergised(new SegmentId("S302")));
        foreach (var dead in new[] { "S303", "S309", "S110", "S111", "S114" })
        {
            Assert.False(network.IsSegmentEnergised(new SegmentId(dead)), $"{dead} is live");
        }

        Assert.True(network.IsSegmentEnergised(new SegmentId("S109")));
    }

    [Fact]
    public void Closing_a_tie_between_two_feeders_of_one_substation_is_reported_as_a_loop_with_its_elements()
    {
        var grid = Grids.Sample("solid");
        var graph = new NetworkGraph(grid);
        var states = SwitchStates.Normal(grid).With(new SwitchId("NO-A1-A2"), SwitchPosition.Closed);

        Assert.False(graph.TryEnergise(states, out var network, out var problem));

        Assert.Null(network);
        Assert.NotNull(problem);
        Assert.Contains("closes a loop", problem.Message, StringComparison.Ordinal);

        // Bus A –CB-A1– … – A1-19 –NO-A1-A2– A2-10 – … –CB-A2– bus A (from the sample grid's data).
        string[] loop =
        [
            "switch CB-A1", "segment S101", "segment S102", "switch LB-A1-1", "segment S103", "segment S104", "switch LB-A1-3",
            "segment S108", "switch DS-A1-5", "segment S112", "segment S113", "switch NO-A1-A2",
            "segment S207", "segment S206", "switch LB-A2-2", "segment S204", "switch LB-A2-1", "segment S202", "segment S201", "switch CB-A2",
        ];
        Assert.Equal(loop.Order(StringComparer.Ordinal), problem.Elements.Order(StringComparer.Ordinal));
        Assert.All(loop, element => Assert.Contains(element, problem.Message, StringComparison.Ordinal));
        var thrown = Assert.Throws<TopologyException>(() => graph.Energise(states));
        Assert.Equal(problem.Message, thrown.Problem.Message);
    }

    [Theory]
    [InlineData("NO-A1-B1")]
    [InlineData("NO-A2-B2")]
    public void Closing_a_tie_between_two_substations_is_reported_as_paralleling_them(string tie)
    {
        var grid = Grids.Sample("solid");
        var states = SwitchStates.Normal(grid).With(new SwitchId(tie), SwitchPosition.Closed);

        Assert.False(new NetworkGraph(grid).TryEnergise(states, out var network, out var problem));

        Assert.Null(network);
        Assert.NotNull(problem);
        Assert.Contains("parallels substations A and B", problem.Message, StringComparison.Ordinal);
        Assert.Contains($"switch {tie}", problem.Elements);
    }

    [Fact]
    public void Opening_the_feeder_end_before_closing_the_tie_keeps_the_network_radial()
    {
        var grid = Grids.Sample("solid");
        var states = SwitchStates.Normal(grid)
            .With(new SwitchId("LB-A2-1"), SwitchPosition.Open)
            .With(new SwitchId("NO-A2-B2"), SwitchPosition.Closed);

        Assert.True(new NetworkGraph(grid).TryEnergise(states, out var network, out var problem), problem?.Message);

        Assert.Equal(new SubstationId("B"), network.SubstationOf(new NodeId("A2-05"))!.Id);
        Assert.Equal(new SubstationId("A"), network.SubstationOf(new NodeId("A2-03"))!.Id);
    }
}
