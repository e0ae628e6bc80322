using System.Runtime.CompilerServices;

namespace FeederLocate.Testing;

/// <summary>Finds files of the repository (the folder holding FeederLocate.sln) from a test or tool.</summary>
public static class RepositoryFiles
{
    private static readonly Lazy<string> LazyRoot = new(FindRoot);

    /// <summary>The repository root; throws when none lies above the output folder or this file's source folder.</summary>
    public static string Root => LazyRoot.Value;

    /// <summary>The folder this file was compiled from: inside the repository wherever the build puts its output.</summary>
    public static string SourceFolder { get; } = SourceDirectory();

    public static string Path(params string[] parts) => System.IO.Path.Combine([Root, .. parts]);

    public static string Read(params string[] parts) => File.ReadAllText(Path(parts));

    /// <summary>The nearest folder holding FeederLocate.sln at or above the first start that has one; null if none has.</summary>
    public static string? Find(params string[] starts)
    {
        foreach (var start in starts)
        {
            for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
            {
                if (File.Exists(System.IO.Path.Combine(dir.FullName, "FeederLocate.sln")))
                {
                    return dir.FullName;
                }
            }
        }

        return null;
    }

    private static string FindRoot() =>
        // The output folder lies inside the repository unless the build is given an artifacts path
        // elsewhere; then the folder this source file was compiled from still does.
        Find(AppContext.BaseDirectory, SourceFolder)
        ?? throw new InvalidOperationException("FeederLocate.sln not found above " + AppContext.BaseDirectory + " or " + SourceFolder);

    private static string SourceDirectory([CallerFilePath] string file = "") =>
        System.IO.Path.GetDirectoryName(file) ?? string.Empty;
}
