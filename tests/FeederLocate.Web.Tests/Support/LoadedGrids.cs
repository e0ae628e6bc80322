using FeederLocate.Application.Grids;
using FeederLocate.Storage.Grids;
using FeederLocate.Web.Services;

namespace FeederLocate.Web.Tests.Support;

/// <summary>The sample grids as the web app holds them.</summary>
public static class LoadedGrids
{
    public static LoadedGrid Sample(string scheme) => LoadedGrid.Of(SampleGrids.FileName(scheme), SampleGrids.Grid(scheme));

    /// <summary>A grid catalogue over the grid files of <paramref name="folder"/>, stored as versions in the database at <paramref name="databasePath"/>.</summary>
    public static GridCatalog Catalog(string folder, string defaultFile, string databasePath) =>
        new(folder, defaultFile, new GridVersions(GridVersionStore.Open(databasePath)));

    /// <summary>The sample grids' catalogue, the solid one first, in the database at <paramref name="databasePath"/>.</summary>
    public static GridCatalog Samples(string databasePath) =>
        Catalog(RepositoryFiles.Path("sample-grid"), SampleGrids.FileName("solid"), databasePath);
}
