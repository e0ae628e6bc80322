using System.Runtime.CompilerServices;

namespace FeederLocate.Core.Tests.Support;

/// <summary>Finds files of the repository from the test's output folder.</summary>
public static class RepositoryFiles
{
    public static string Root { get; } = FindRoot();

    public static string Path(params string[] parts) => System.IO.Path.Combine([Root, .. parts]);

    public static string Read(params string[] parts) => File.ReadAllText(Path(parts));

    private static string FindRoot()
    {
        // The output folder lies inside the repository unless the build is given an artifacts path
        // elsewhere; then the folder this source file was compiled from still does.
        foreach (var start in new[] { AppContext.BaseDirectory, SourceDirectory() })
        {
            for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
            {
                if (File.Exists(System.IO.Path.Combine(dir.FullName, "FeederLocate.sln")))
                {
                    return dir.FullName;
                }
            }
        }

        throw new InvalidOperationException("FeederLocate.sln not found above " + AppContext.BaseDirectory + " or " + SourceDirectory());
    }

    private static string SourceDirectory([CallerFilePath] string file = "") =>
        System.IO.Path.GetDirectoryName(file) ?? string.Empty;
}
