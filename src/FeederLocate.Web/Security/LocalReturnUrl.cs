namespace FeederLocate.Web.Security;

/// <summary>Where to go after signing in: only a path on this site, never another host.</summary>
public static class LocalReturnUrl
{
    public static string Or(string? returnUrl, string fallback = "/") =>
        returnUrl is { Length: > 0 } url && url[0] == '/' && (url.Length == 1 || (url[1] != '/' && url[1] != '\\')) && !url.Contains("://", StringComparison.Ordinal)
            ? url
            : fallback;
}
