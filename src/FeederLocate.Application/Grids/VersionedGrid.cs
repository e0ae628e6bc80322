using FeederLocate.Core.Model;
using FeederLocate.Storage.Grids;

namespace FeederLocate.Application.Grids;

/// <summary>A stored grid version with the grid read from its text.</summary>
public sealed record VersionedGrid(GridVersion Version, Grid Grid)
{
    public string Name => Version.GridName;

    public int Number => Version.Version;
}
