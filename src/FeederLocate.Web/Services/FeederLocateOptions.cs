namespace FeederLocate.Web.Services;

/// <summary>Settings of the web app (section "FeederLocate" of the configuration).</summary>
public sealed class FeederLocateOptions
{
    /// <summary>Folder whose *.grid.json files are offered; a relative path starts at the app's folder (its content root).</summary>
    public string GridFolder { get; set; } = "sample-grid";

    /// <summary>The grid a new incident opens on unless another is chosen (file name without folder).</summary>
    public string DefaultGrid { get; set; } = "marrowdell-resonant.grid.json";

    /// <summary>The SQLite incident log, created on first run; a relative path starts at the app's folder.</summary>
    public string DatabasePath { get; set; } = "feederlocate.db";

    /// <summary>
    /// The first run's administrator password (also environment variable FEEDERLOCATE_ADMIN_PASSWORD); when
    /// neither is set, the first run prints a one-time password. Ignored once any account exists.
    /// </summary>
    public string? AdministratorPassword { get; set; }

    /// <summary>
    /// The addresses of the TLS-terminating proxies whose X-Forwarded-For and X-Forwarded-Proto are believed
    /// (for instance 127.0.0.1 when the proxy runs on the same machine); none by default.
    /// </summary>
    public string[] TrustedProxies { get; set; } = [];

    /// <summary>Failed sign-ins a client may make before each further attempt must wait (doubling from 1 s).</summary>
    public int SignInFreeFailuresPerClient { get; set; } = Security.SignInThrottle.DefaultFreeFailures;

    /// <summary>When true, the start gives the "admin" account a new printed one-time password (for when no engineer can sign in).</summary>
    public bool ResetAdministrator { get; set; }
}
