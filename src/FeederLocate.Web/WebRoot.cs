using FeederLocate.Web.Services;

namespace FeederLocate.Web;

/// <summary>The web app's static files live in the repository's top-level wwwroot/.</summary>
internal static class WebRoot
{
    public static string Find(params string[] starts)
    {
        foreach (var start in starts)
        {
            if (RepositoryPaths.Find(start) is { } root && Directory.Exists(Path.Combine(root, "wwwroot")))
            {
                return Path.Combine(root, "wwwroot");
            }
        }

        return Path.Combine(starts[0], "wwwroot");
    }
}
