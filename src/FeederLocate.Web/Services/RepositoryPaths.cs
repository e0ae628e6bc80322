namespace FeederLocate.Web.Services;

/// <summary>Finds the repository root (the folder holding FeederLocate.sln) above a start folder.</summary>
public static class RepositoryPaths
{
    public static string Root(string start)
    {
        for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "FeederLocate.sln")))
            {
                return dir.FullName;
            }
        }

        return start;
    }

    public static string Resolve(string root, string path) => Path.IsPathRooted(path) ? path : Path.GetFullPath(Path.Combine(root, path));
}
