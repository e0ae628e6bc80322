namespace FeederLocate.Web;

/// <summary>The web app's static files live in the repository's top-level wwwroot/.</summary>
internal static class WebRoot
{
    public static string Find(params string[] starts)
    {
        foreach (var start in starts)
        {
            for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
            {
                var candidate = Path.Combine(dir.FullName, "wwwroot");
                if (File.Exists(Path.Combine(dir.FullName, "FeederLocate.sln")) && Directory.Exists(candidate))
                {
                    return candidate;
                }
            }
        }

        return Path.Combine(starts[0], "wwwroot");
    }
}
