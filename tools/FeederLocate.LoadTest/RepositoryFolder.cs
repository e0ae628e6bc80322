using FeederLocate.Testing;

namespace FeederLocate.LoadTest;

/// <summary>The repository's sample grids, found above the program, the working folder or the shared test kit's source.</summary>
public static class RepositoryFolder
{
    public static string SampleGrids() => Path.Combine(Root(), "sample-grid");

    public static string Root() =>
        RepositoryFiles.Find(AppContext.BaseDirectory, Directory.GetCurrentDirectory(), RepositoryFiles.SourceFolder)
        ?? Directory.GetCurrentDirectory();
}
