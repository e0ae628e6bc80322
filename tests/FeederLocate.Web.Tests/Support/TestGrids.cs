using FeederLocate.Core.Formats;
using FeederLocate.Web.Services;

namespace FeederLocate.Web.Tests.Support;

public static class TestGrids
{
    public static string Root { get; } = RepositoryPaths.Root(AppContext.BaseDirectory) is var root && File.Exists(Path.Combine(root, "FeederLocate.sln"))
        ? root
        : RepositoryPaths.Root(Path.GetDirectoryName(SourceFile())!);

    public static LoadedGrid Sample(string scheme) =>
        LoadedGrid.Of($"marrowdell-{scheme}.grid.json", GridReader.Parse(File.ReadAllText(Path.Combine(Root, "sample-grid", $"marrowdell-{scheme}.grid.json"))).ValueOrThrow());

    private static string SourceFile([System.Runtime.CompilerServices.CallerFilePath] string path = "") => path;
}
