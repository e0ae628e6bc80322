using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Support;

/// <summary>Grids used across tests, loaded through the real reader.</summary>
public static class Grids
{
    public static Grid TinyFen(string scheme) =>
        GridReader.Parse(RepositoryFiles.Read("tests", "FeederLocate.Core.Tests", "ReferenceCases", "TinyFen", $"tiny-{scheme}.grid.json")).ValueOrThrow();

    public static Grid Sample(string scheme) =>
        GridReader.Parse(RepositoryFiles.Read("sample-grid", $"marrowdell-{scheme}.grid.json")).ValueOrThrow();

    public static EnergisedNetwork Normal(Grid grid) => new NetworkGraph(grid).Energise(SwitchStates.Normal(grid));
}
