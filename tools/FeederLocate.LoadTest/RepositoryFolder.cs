namespace FeederLocate.LoadTest;

/// <summary>The repository's sample grids, found above the program, the working folder or this source file.</summary>
public static class RepositoryFolder
{
    public static string SampleGrids() => Path.Combine(Root(), "sample-grid");

    public static string Root()
    {
        foreach (var start in new[] { AppContext.BaseDirectory, Directory.GetCurrentDirectory(), Path.GetDirectoryName(SourceFile()) ?? "." })
        {
            for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
            {
                if (File.Exists(Path.Combine(dir.FullName, "FeederLocate.sln")))
                {
                    return dir.FullName;
                }
            }
        }

        return Directory.GetCurrentDirectory();
    }

    private static string SourceFile([System.Runtime.CompilerServices.CallerFilePath] string path = "") => path;
}
