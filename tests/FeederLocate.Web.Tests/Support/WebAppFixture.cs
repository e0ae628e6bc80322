using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Hosting.Server;
using Microsoft.AspNetCore.Hosting.Server.Features;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Security;
using Microsoft.Playwright;

namespace FeederLocate.Web.Tests.Support;

/// <summary>
/// The app served in-process on a loopback port with a fresh incident log, and Debian's Chromium
/// driven by Playwright (no browser download: the system's /usr/bin/chromium).
/// </summary>
public sealed class WebAppFixture : IAsyncLifetime
{
    public const string ChromiumPath = "/usr/bin/chromium";
    private readonly string _folder = Directory.CreateTempSubdirectory("feederlocate-web-").FullName;
    private WebApplicationFactory<Program>? _factory;
    private IPlaywright? _playwright;

    public const string AdministratorPassword = "first-run-password-for-browser-tests";
    private static readonly Actor Setup = new("admin", "engineer");

    public IBrowser Browser { get; private set; } = default!;

    public AccountDirectory Accounts { get; private set; } = default!;

    /// <summary>What the server logged at warning level and above; written to the artifacts folder at the end.</summary>
    public ServerLog ServerLog { get; } = new();

    /// <summary>The app's services, for setting up a scene without clicking through it.</summary>
    public IServiceProvider Services => _factory!.Services;

    public string BaseAddress { get; private set; } = string.Empty;

    public string ArtifactsFolder => Path.Combine(RepositoryFiles.Root, "tests", "FeederLocate.Web.Tests", "bin", "screenshots");

    public async Task InitializeAsync()
    {
        await EnsureChromium();

        // A 2-core machine that also computes rankings and plans on every change: give the page time.
        Assertions.SetDefaultExpectTimeout(30_000);
        StartApp();
        Accounts = _factory.Services.GetRequiredService<AccountDirectory>();
        Accounts.CreateWithPassword("ana", "Ana Field", AccountRole.Operator, "ana-password-1", null, Setup);
        Accounts.CreateWithPassword("ben", "Ben Line", AccountRole.Operator, "ben-password-1", null, Setup);
        Accounts.CreateWithPassword("vera", "<img src=x onerror=alert(1)>Vera", AccountRole.Viewer, "vera-password-1", null, Setup);

        _playwright = await Playwright.CreateAsync();
        Browser = await _playwright.Chromium.LaunchAsync(new BrowserTypeLaunchOptions
        {
            ExecutablePath = ChromiumPath,
            Headless = true,
            Args = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                "--disable-background-networking", "--disable-component-update", "--disable-sync"],
        });
    }

    /// <summary>
    /// Stops the app and starts it again on the same database file and grid folder, as a restart of the server
    /// does; the accounts, incidents and grid versions are what the file holds. Open pages lose their circuit.
    /// </summary>
    public async Task RestartAsync()
    {
        if (_factory is not null)
        {
            await _factory.DisposeAsync();
        }

        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        StartApp();
        Accounts = _factory.Services.GetRequiredService<AccountDirectory>();
    }

    [System.Diagnostics.CodeAnalysis.MemberNotNull(nameof(_factory))]
    private void StartApp()
    {
        _factory = new WebApplicationFactory<Program>().WithWebHostBuilder(b =>
        {
            b.UseSetting("FeederLocate:DatabasePath", Path.Combine(_folder, "incidents.db"));
            b.UseSetting("FeederLocate:GridFolder", Path.Combine(RepositoryFiles.Root, "sample-grid"));
            b.UseSetting("Urls", "http://127.0.0.1:0");
            b.UseSetting("FeederLocate:AdministratorPassword", AdministratorPassword);
            // Every test client here has one address: the sign-in throttle has tests of its own (SignInAbuseTests).
            b.UseSetting("FeederLocate:SignInFreeFailuresPerClient", "1000");
            b.ConfigureLogging(logging => logging.AddProvider(ServerLog));
        });
        _factory.UseKestrel(0);
        _factory.StartServer();
        var addresses = _factory.Services.GetRequiredService<IServer>().Features.Get<IServerAddressesFeature>()!.Addresses;
        for (var wait = 0; wait < 50 && !addresses.Any(a => a.StartsWith("http://", StringComparison.Ordinal)); wait++)
        {
            Thread.Sleep(100);
        }

        // The loopback address Kestrel bound; after a restart it has been seen listed as localhost instead.
        BaseAddress = addresses.FirstOrDefault(a => a.StartsWith("http://127.0.0.1", StringComparison.Ordinal))
            ?? addresses.FirstOrDefault(a => a.StartsWith("http://localhost", StringComparison.Ordinal))?.Replace("http://localhost", "http://127.0.0.1", StringComparison.Ordinal)
            ?? throw new InvalidOperationException($"the app listens on no loopback address: [{string.Join(", ", addresses)}]");
    }

    /// <summary>A new page (its own cookies) signed in through the sign-in form, left on <paramref name="path"/>.</summary>
    public async Task<IPage> SignedInPage(string name, string password, string path = "/", BrowserNewPageOptions? options = null)
    {
        var page = await Browser.NewPageAsync(options);
        await page.GotoAsync($"{BaseAddress}/sign-in?returnUrl={Uri.EscapeDataString(path)}", new PageGotoOptions { Timeout = 90_000 });
        await page.FillAsync("[data-testid=sign-in-name]", name);
        await page.FillAsync("[data-testid=sign-in-password]", password);
        await page.ClickAsync("[data-testid=sign-in]");
        await page.WaitForURLAsync(url => !url.Contains("/sign-in", StringComparison.Ordinal), new PageWaitForURLOptions { Timeout = 90_000 });
        return page;
    }

    /// <summary>
    /// Waits until the page is on a path starting with <paramref name="pathStart"/>; when it does not get
    /// there, the failure says where the page is, what it shows and what the server logged, with a screenshot.
    /// </summary>
    public async Task WaitForPath(IPage page, string pathStart)
    {
        try
        {
            // Polls the page's address: an interactive navigation is a history.pushState, which a navigation
            // waiter can miss when it lands before the waiter starts.
            await Assertions.Expect(page).ToHaveURLAsync(
                new System.Text.RegularExpressions.Regex("^https?://[^/]+" + System.Text.RegularExpressions.Regex.Escape(pathStart)),
                new PageAssertionsToHaveURLOptions { Timeout = 90_000 });
        }
        catch (PlaywrightException e)
        {
            Directory.CreateDirectory(ArtifactsFolder);
            var shot = Path.Combine(ArtifactsFolder, $"timeout-{DateTime.UtcNow:HHmmss}.png");
            await page.ScreenshotAsync(new PageScreenshotOptions { Path = shot, FullPage = true });
            var text = await page.Locator("body").InnerTextAsync();
            throw new TimeoutException(
                $"the page did not reach {pathStart}: it is at {page.Url}, shows \"{text[..Math.Min(600, text.Length)]}\" (screenshot {shot}); server log:{Environment.NewLine}{string.Join(Environment.NewLine, ServerLog.Lines.TakeLast(20))}", e);
        }
    }

    /// <summary>
    /// The test command does all set-up on a fresh machine: where Debian's Chromium is missing it is
    /// installed (the machine's package manager; no browser download from anywhere else).
    /// </summary>
    private static async Task EnsureChromium()
    {
        if (File.Exists(ChromiumPath))
        {
            return;
        }

        var install = System.Diagnostics.Process.Start(new System.Diagnostics.ProcessStartInfo("bash",
            ["-c", "apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium"])
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
        })!;
        var error = await install.StandardError.ReadToEndAsync();
        await install.WaitForExitAsync();
        if (install.ExitCode != 0 || !File.Exists(ChromiumPath))
        {
            throw new InvalidOperationException($"the browser tests need Debian's Chromium at {ChromiumPath}; installing it failed: {error}");
        }
    }

    public async Task DisposeAsync()
    {
        await Browser.DisposeAsync();
        _playwright?.Dispose();
        if (_factory is not null)
        {
            await _factory.DisposeAsync();
        }

        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        Directory.Delete(_folder, recursive: true);
        Directory.CreateDirectory(ArtifactsFolder);
        await File.WriteAllLinesAsync(Path.Combine(ArtifactsFolder, $"server-log-{Guid.NewGuid():N}.txt"), ServerLog.Lines);
    }
}
