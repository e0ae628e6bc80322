using FeederLocate.Core.Comparison;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Tests.Comparison;

public class GridComparisonTests
{
    private static Grid Edited(
        Func<Substation, Substation>? substation = null,
        IEnumerable<Node>? extraNodes = null,
        Func<IEnumerable<Segment>, IEnumerable<Segment>>? segments = null,
        Func<IEnumerable<SwitchingDevice>, IEnumerable<SwitchingDevice>>? switches = null,
        Func<IEnumerable<Indicator>, IEnumerable<Indicator>>? indicators = null,
        Func<IEnumerable<LineType>, IEnumerable<LineType>>? lineTypes = null,
        string? name = null)
    {
        var g = TestGrids.Brackenfold();
        return Grid.Create(
            name ?? g.Name,
            g.FrequencyHz,
            [.. (lineTypes ?? (x => x))(g.LineTypes)],
            [.. g.Substations.Select(substation ?? (s => s))],
            [.. g.Nodes, .. extraNodes ?? []],
            [.. (segments ?? (x => x))(g.Segments)],
            [.. (switches ?? (x => x))(g.Switches)],
            [.. (indicators ?? (x => x))(g.Indicators)]);
    }

    [Fact]
    public void The_same_grid_has_no_differences()
    {
        Assert.True(GridComparison.Compare(TestGrids.Brackenfold(), TestGrids.Brackenfold()).IsEmpty);
    }

    [Fact]
    public void Added_removed_and_changed_elements_are_named_by_kind_and_id_with_the_changed_fields()
    {
        var after = Edited(
            substation: s => s with { Grounding = s.Grounding with { Scheme = GroundingScheme.Isolated, DetuningPercent = 0, DampingPercent = 3 } },
            extraNodes: [new Node(new NodeId("N6"), 120, Customers: 9)],
            segments: s => s.Append(new Segment(new SegmentId("S4"), new NodeId("N5"), new NodeId("N6"), new LineTypeId("OHL-AL95"), 1.5)),
            switches: s => s.Select(d => d.Id.Value == "LB2" ? d with { Remote = false } : d),
            indicators: i => i.Where(x => x.Id.Value != "FI4"),
            lineTypes: l => l.Select(t => t.Id.Value == "OHL-AL95" ? t with { AmpacityA = 280 } : t));

        var difference = GridComparison.Compare(TestGrids.Brackenfold(), after);

        Assert.Empty(difference.GridFields);
        Assert.Equal(
            [
                ("substation", "BKF", ElementChangeKind.Changed),
                ("node", "N6", ElementChangeKind.Added),
                ("segment", "S4", ElementChangeKind.Added),
                ("switch", "LB2", ElementChangeKind.Changed),
                ("indicator", "FI4", ElementChangeKind.Removed),
                ("line type", "OHL-AL95", ElementChangeKind.Changed),
            ],
            difference.Elements.Select(e => (e.Kind, e.Id, e.Change)));
        var substation = difference.Elements[0].Fields;
        Assert.Contains(new FieldChange("grounding.scheme", "resonant", "isolated"), substation);
        Assert.Contains(substation, f => f.Field == "grounding.detuningPercent" && f.After is null or "0");
        Assert.Equal(new FieldChange("remote", "true", "false"), Assert.Single(difference.Elements[3].Fields));
        Assert.Equal(new FieldChange("ampacityA", "300", "280"), Assert.Single(difference.Elements[5].Fields));
        Assert.Equal(2, difference.Added.Count());
        Assert.Single(difference.Removed);
        Assert.Equal(3, difference.Changed.Count());
    }

    [Fact]
    public void A_new_name_is_a_change_of_the_grid_itself()
    {
        var difference = GridComparison.Compare(TestGrids.Brackenfold(), TestGrids.Brackenfold("Brackenfold 20 kV north"));

        Assert.Equal(new FieldChange("name", "Brackenfold 20 kV", "Brackenfold 20 kV north"), Assert.Single(difference.GridFields));
        Assert.Empty(difference.Elements);
    }

    [Fact]
    public void The_comparison_is_symmetric_in_what_is_added_and_removed()
    {
        var after = Edited(indicators: i => i.Where(x => x.Id.Value != "FI1"));

        var forward = GridComparison.Compare(TestGrids.Brackenfold(), after);
        var backward = GridComparison.Compare(after, TestGrids.Brackenfold());

        Assert.Equal("FI1", Assert.Single(forward.Removed).Id);
        Assert.Equal("FI1", Assert.Single(backward.Added).Id);
    }

    [Fact]
    public void Crew_bases_added_and_changed_are_listed_with_their_fields()
    {
        var depot = new CrewBase(new CrewBaseId("DEPOT"), TestGrids.Brackenfold().Nodes[0].Id, 1);
        var before = TestGrids.Brackenfold().WithCrewBases([depot]);
        var after = TestGrids.Brackenfold().WithCrewBases([depot with { Count = 3 }, new CrewBase(new CrewBaseId("YARD"), TestGrids.Brackenfold().Nodes[0].Id, 1)]);

        var difference = GridComparison.Compare(before, after);

        Assert.Equal([("crew base", "DEPOT", ElementChangeKind.Changed), ("crew base", "YARD", ElementChangeKind.Added)],
            difference.Elements.Select(e => (e.Kind, e.Id, e.Change)));
        Assert.Equal(new FieldChange("count", "1", "3"), Assert.Single(difference.Elements[0].Fields));
    }
}
