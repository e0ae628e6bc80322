using FeederLocate.Web.Services;

namespace FeederLocate.Web.Tests.Support;

/// <summary>The sample grids as the web app holds them.</summary>
public static class LoadedGrids
{
    public static LoadedGrid Sample(string scheme) => LoadedGrid.Of(SampleGrids.FileName(scheme), SampleGrids.Grid(scheme));
}
