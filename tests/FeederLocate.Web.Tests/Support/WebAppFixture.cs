using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Hosting.Server;
using Microsoft.AspNetCore.Hosting.Server.Features;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.Extensions.DependencyInjection;
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

    /// <summary>The app's services, for setting up a scene without clicking through it.</summary>
    public IServiceProvider Services => _factory!.Services;

    public string BaseAddress { get; private set; } = string.Empty;

    public string ArtifactsFolder => Path.Combine(TestGrids.Root, "tests", "FeederLocate.Web.Tests", "bin", "screenshots");

    public async Task InitializeAsync()
    {
        await EnsureChromium();

        // A 2-core machine that also computes rankings and plans on every change: give the page time.
        Assertions.SetDefaultExpectTimeout(30_000);
        _factory = new WebApplicationFactory<Program>().WithWebHostBuilder(b =>
        {
            b.UseSetting("FeederLocate:DatabasePath", Path.Combine(_folder, "incidents.db"));
            b.UseSetting("FeederLocate:GridFolder", Path.Combine(TestGrids.Root, "sample-grid"));
            b.UseSetting("Urls", "http://127.0.0.1:0");
            b.UseSetting("FeederLocate:AdministratorPassword", AdministratorPassword);
        });
        _factory.UseKestrel(0);
        _factory.StartServer();
        var addresses = _factory.Services.GetRequiredService<IServer>().Features.Get<IServerAddressesFeature>()!.Addresses;
        BaseAddress = addresses.First(a => a.StartsWith("http://127.0.0.1", StringComparison.Ordinal));
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
    }
}
