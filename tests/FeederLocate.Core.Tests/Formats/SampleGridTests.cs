using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Formats;

public class SampleGridTests
{
    public static TheoryData<string> Schemes => new() { "isolated", "resonant", "solid", "impedance" };

    [Theory]
    [MemberData(nameof(Schemes))]
    public void Sample_grid_loads_without_errors_or_warnings(string scheme)
    {
        var result = GridReader.Parse(RepositoryFiles.Read("sample-grid", $"marrowdell-{scheme}.grid.json"));

        Assert.True(result.Succeeded, string.Join("\n", result.Issues));
        Assert.Empty(result.Issues);
        Assert.All(result.Value!.Substations, s => Assert.Equal(scheme, GridFormat.Name(s.Grounding.Scheme)));
    }

    [Theory]
    [MemberData(nameof(Schemes))]
    public void Sample_grid_meets_the_scenario_brief(string scheme)
    {
        var grid = Grids.Sample(scheme);
        var graph = new NetworkGraph(grid);

        Assert.InRange(grid.Substations.Length, 1, 2);
        Assert.True(grid.Segments.Length >= 40);
        Assert.Contains(grid.LineTypes, t => t.Construction == Construction.Cable);
        Assert.Contains(grid.LineTypes, t => t.Construction == Construction.Overhead);
        Assert.True(grid.Indicators.Length >= 12);
        Assert.Contains(grid.Indicators, i => i.Directional);
        Assert.Contains(grid.Indicators, i => !i.Directional);
        Assert.Contains(grid.Indicators, i => i.Remote);
        Assert.Contains(grid.Indicators, i => !i.Remote);
        Assert.True(grid.Switches.Count(s => s.NormallyOpen) >= 2);
        Assert.True(grid.Switches.Count(s => s.Kind == SwitchKind.Breaker) >= 3);
        Assert.True(graph.Sections.All.Length > grid.Indicators.Length, "more sections than indicators, as in the field");

        // Every node is fed in the normal state.
        var network = graph.Energise(SwitchStates.Normal(grid));
        Assert.All(grid.Nodes, n => Assert.True(network.IsEnergised(n.Id), $"node {n.Id} is dead"));

        // One tie reaches the neighbouring substation.
        Assert.Contains(grid.Switches.Where(s => s.NormallyOpen), s =>
            network.SubstationOf(s.From)!.Id != network.SubstationOf(s.To)!.Id);
    }
}
