namespace FeederLocate.Web.Services;

/// <summary>Finds the repository root (the folder holding FeederLocate.sln) above a start folder.</summary>
public static class RepositoryPaths
{
    /// <summary>The nearest folder at or above <paramref name="start"/> holding FeederLocate.sln, or null if there is none.</summary>
    public static string? Find(string start)
    {
        for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "FeederLocate.sln")))
            {
                return dir.FullName;
            }
        }

        return null;
    }

    /// <summary>The repository root above <paramref name="start"/>, or <paramref name="start"/> itself outside a repository.</summary>
    public static string Root(string start) => Find(start) ?? start;

    public static string Resolve(string root, string path) => Path.IsPathRooted(path) ? path : Path.GetFullPath(Path.Combine(root, path));
}
