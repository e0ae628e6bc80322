using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Support;

/// <summary>Grids used across tests, loaded through the real reader.</summary>
public static class Grids
{
    public static Grid TinyFen(string scheme) => SampleGrids.TinyFen(scheme);

    public static Grid Sample(string scheme) => SampleGrids.Grid(scheme);

    public static EnergisedNetwork Normal(Grid grid) => new NetworkGraph(grid).Energise(SwitchStates.Normal(grid));
}
