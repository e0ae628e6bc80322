using System.Net;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Security;
using FeederLocate.Web.Tests.Support;
using Microsoft.AspNetCore.Identity;
using Microsoft.Extensions.DependencyInjection;

namespace FeederLocate.Web.Tests.Security;

/// <summary>Signing in through the form: antiforgery, wrong passwords and locks, one-time passwords, roles, sessions that end.</summary>
public sealed class SignInTests(ApiFixture app) : IClassFixture<ApiFixture>
{
    private static readonly Actor Engineer = new("admin", "engineer");

    private static string Location(HttpResponseMessage answer) => answer.Headers.Location?.OriginalString ?? string.Empty;

    [Fact]
    public async Task A_sign_in_post_without_its_antiforgery_token_is_a_400_and_signs_nobody_in()
    {
        var browser = FormSignIn.NewBrowser(app.Factory);

        var answer = await browser.PostAsync("/account/sign-in", new FormUrlEncodedContent(new Dictionary<string, string>
        {
            ["name"] = "admin",
            ["password"] = ApiFixture.AdministratorPassword,
        }));
        var board = await browser.GetAsync("/");

        Assert.Equal(HttpStatusCode.BadRequest, answer.StatusCode);
        Assert.Contains("antiforgery", await answer.Content.ReadAsStringAsync(), StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.Redirect, board.StatusCode);
        Assert.StartsWith("/sign-in", new Uri(new Uri("http://localhost"), Location(board)).AbsolutePath, StringComparison.Ordinal);
    }

    [Fact]
    public async Task The_administrator_signs_in_with_the_configured_password_and_sees_the_accounts_page()
    {
        var browser = await FormSignIn.SignedIn(app.Factory, "admin", ApiFixture.AdministratorPassword);

        var board = await browser.GetAsync("/");
        var accounts = await browser.GetAsync("/accounts");

        Assert.Equal(HttpStatusCode.OK, board.StatusCode);
        Assert.Contains("Administrator · engineer", await board.Content.ReadAsStringAsync(), StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.OK, accounts.StatusCode);
    }

    [Fact]
    public async Task A_wrong_password_is_refused_and_five_in_a_row_lock_the_account_with_the_same_answer()
    {
        app.Accounts.CreateWithPassword("locky", "Locky", AccountRole.Operator, "the-right-password", null, Engineer);
        var browser = FormSignIn.NewBrowser(app.Factory);

        var first = await FormSignIn.Post(browser, "locky", "a-wrong-password");
        for (var i = 0; i < AccountDirectory.LockAfterFailures - 1; i++)
        {
            await FormSignIn.Post(browser, "locky", "a-wrong-password");
        }

        var right = await FormSignIn.Post(browser, "locky", "the-right-password");

        Assert.Contains("failed=wrong", Location(first), StringComparison.Ordinal);
        Assert.Contains("failed=wrong", Location(right), StringComparison.Ordinal);
        Assert.True(app.Accounts.Find("locky")!.IsLockedAt(DateTimeOffset.UtcNow));
        Assert.Equal(HttpStatusCode.Redirect, (await browser.GetAsync("/")).StatusCode);
    }

    [Fact]
    public async Task A_one_time_password_leads_to_the_password_page_and_nowhere_else_until_changed()
    {
        var (_, oneTime) = app.Accounts.Create("newcomer", "Newcomer", AccountRole.Operator, null, Engineer);
        var browser = FormSignIn.NewBrowser(app.Factory);

        var signIn = await FormSignIn.Post(browser, "newcomer", oneTime);
        var boardBefore = await browser.GetAsync("/");
        var token = await FormSignIn.AntiforgeryToken(browser, AccountEndpoints.PasswordPage);
        var change = await browser.PostAsync("/account/new-password", new FormUrlEncodedContent(new Dictionary<string, string>
        {
            ["__RequestVerificationToken"] = token,
            ["currentPassword"] = oneTime,
            ["newPassword"] = "my-own-long-password",
            ["confirmPassword"] = "my-own-long-password",
            ["returnUrl"] = "/",
        }));
        var boardAfter = await browser.GetAsync("/");

        Assert.StartsWith(AccountEndpoints.PasswordPage, Location(signIn), StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.Redirect, boardBefore.StatusCode);
        Assert.Equal(("/", HttpStatusCode.OK), (Location(change), boardAfter.StatusCode));
        Assert.False(app.Accounts.Find("newcomer")!.MustChangePassword);
        Assert.Contains("failed=wrong", Location(await FormSignIn.Post(FormSignIn.NewBrowser(app.Factory), "newcomer", oneTime)), StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_too_short_new_password_is_refused_naming_the_rule()
    {
        app.Accounts.CreateWithPassword("shorty", "Shorty", AccountRole.Viewer, "shorty-password-1", null, Engineer);
        var browser = await FormSignIn.SignedIn(app.Factory, "shorty", "shorty-password-1");
        var token = await FormSignIn.AntiforgeryToken(browser, AccountEndpoints.PasswordPage);

        var change = await browser.PostAsync("/account/new-password", new FormUrlEncodedContent(new Dictionary<string, string>
        {
            ["__RequestVerificationToken"] = token,
            ["currentPassword"] = "shorty-password-1",
            ["newPassword"] = "short",
            ["confirmPassword"] = "short",
        }));

        var shown = await (await browser.GetAsync(Location(change))).Content.ReadAsStringAsync();
        Assert.Contains($"Not changed: the new password must be at least {PasswordRules.MinimumLength} characters.", shown, StringComparison.Ordinal);
        Assert.Equal("/", Location(await FormSignIn.Post(FormSignIn.NewBrowser(app.Factory), "shorty", "shorty-password-1")));
    }

    [Fact]
    public async Task The_password_page_shows_only_its_own_sentences_never_text_from_the_address()
    {
        var browser = await FormSignIn.SignedIn(app.Factory, "watcher", "watcher-password");

        var page = await browser.GetStringAsync($"{AccountEndpoints.PasswordPage}?problem={Uri.EscapeDataString("call 0800 to reset")}");
        var signIn = await FormSignIn.NewBrowser(app.Factory).GetStringAsync("/sign-in?failed=wait&seconds=" + Uri.EscapeDataString("never; call 0800"));

        Assert.Contains("Not changed: the password was not changed.", page, StringComparison.Ordinal);
        Assert.DoesNotContain("0800", page, StringComparison.Ordinal);
        Assert.DoesNotContain("0800", signIn, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_viewer_sees_incidents_but_not_the_accounts_page_nor_the_controls_to_open_one()
    {
        var browser = await FormSignIn.SignedIn(app.Factory, "watcher", "watcher-password");

        var board = await browser.GetAsync("/");
        var accounts = await browser.GetAsync("/accounts");
        var grids = await browser.GetAsync("/grids");

        Assert.Equal(HttpStatusCode.OK, board.StatusCode);
        Assert.DoesNotContain("data-testid=\"open-incident\"", await board.Content.ReadAsStringAsync(), StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.Redirect, accounts.StatusCode);
        Assert.StartsWith("/access-denied", new Uri(new Uri("http://localhost"), Location(accounts)).AbsolutePath, StringComparison.Ordinal);
        var gridsPage = await grids.Content.ReadAsStringAsync();
        Assert.Contains("grid-load-engineers-only", gridsPage, StringComparison.Ordinal);
        Assert.DoesNotContain("data-testid=\"grid-file\"", gridsPage, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Disabling_an_account_or_changing_its_role_ends_its_open_sessions()
    {
        app.Accounts.CreateWithPassword("leaver", "Leaver", AccountRole.Operator, "leaver-password", null, Engineer);
        app.Accounts.CreateWithPassword("mover", "Mover", AccountRole.Operator, "mover-password", null, Engineer);
        var leaver = await FormSignIn.SignedIn(app.Factory, "leaver", "leaver-password");
        var mover = await FormSignIn.SignedIn(app.Factory, "mover", "mover-password");
        Assert.Equal(HttpStatusCode.OK, (await leaver.GetAsync("/")).StatusCode);
        Assert.Equal(HttpStatusCode.OK, (await mover.GetAsync("/")).StatusCode);

        app.Accounts.Disable("leaver", Engineer);
        app.Accounts.SetRole("mover", AccountRole.Viewer, Engineer);

        Assert.Equal(HttpStatusCode.Redirect, (await leaver.GetAsync("/")).StatusCode);
        Assert.Equal(HttpStatusCode.Redirect, (await mover.GetAsync("/")).StatusCode);
        Assert.Contains("failed=wrong", Location(await FormSignIn.Post(FormSignIn.NewBrowser(app.Factory), "leaver", "leaver-password")), StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_display_name_with_markup_is_shown_as_text()
    {
        const string Markup = "<img src=x onerror=alert(1)><b>Mallory</b>";
        app.Accounts.CreateWithPassword("mallory", Markup, AccountRole.Viewer, "mallory-password", null, Engineer);
        var browser = await FormSignIn.SignedIn(app.Factory, "mallory", "mallory-password");

        var page = await (await browser.GetAsync("/")).Content.ReadAsStringAsync();

        Assert.DoesNotContain("<img src=x", page, StringComparison.Ordinal);
        Assert.DoesNotContain("<b>Mallory</b>", page, StringComparison.Ordinal);
        Assert.Contains("&lt;img src=x onerror=alert(1)&gt;&lt;b&gt;Mallory&lt;/b&gt;", page, StringComparison.Ordinal);
    }

    [Fact]
    public async Task The_page_of_an_incident_on_another_grid_reads_as_if_the_incident_did_not_exist()
    {
        var board = app.Factory.Services.GetRequiredService<Services.IncidentBoard>();
        var grids = app.Factory.Services.GetRequiredService<Services.GridCatalog>();
        var resonant = board.Open(grids.Find("Marrowdell 20 kV (resonant, arc-suppression coil)")!, null, null, DateTimeOffset.UtcNow, Engineer);
        var solid = board.Open(grids.Find(ApiFixture.SolidGrid)!, null, null, DateTimeOffset.UtcNow, Engineer);
        var browser = await FormSignIn.SignedIn(app.Factory, "solid-only", "solid-only-password");

        var other = await (await browser.GetAsync($"/incidents/{resonant}")).Content.ReadAsStringAsync();
        var missing = await (await browser.GetAsync("/incidents/987654")).Content.ReadAsStringAsync();
        var own = await (await browser.GetAsync($"/incidents/{solid}")).Content.ReadAsStringAsync();
        var list = await (await browser.GetAsync("/")).Content.ReadAsStringAsync();

        Assert.Contains($"There is no incident {resonant}.", other, StringComparison.Ordinal);
        Assert.DoesNotContain("resonant, arc-suppression coil", other, StringComparison.Ordinal);
        Assert.Contains("There is no incident 987654.", missing, StringComparison.Ordinal);
        Assert.Contains($"Incident {solid} on {ApiFixture.SolidGrid}", own, StringComparison.Ordinal);
        Assert.DoesNotContain($"href=\"/incidents/{resonant}\"", list, StringComparison.Ordinal);
        Assert.Contains($"href=\"/incidents/{solid}\"", list, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("//elsewhere.example/steal")]
    [InlineData("https://elsewhere.example/")]
    [InlineData("/\\elsewhere.example")]
    public async Task After_signing_in_only_a_path_on_this_site_is_followed(string returnUrl)
    {
        var browser = FormSignIn.NewBrowser(app.Factory);

        var answer = await FormSignIn.Post(browser, "watcher", "watcher-password", returnUrl);

        Assert.Equal("/", Location(answer));
    }

    [Fact]
    public void Passwords_are_kept_only_as_salted_PBKDF2_hashes()
    {
        var account = app.Accounts.CreateWithPassword("hashed", "Hashed", AccountRole.Viewer, "a-password-to-hash", null, Engineer);
        var twin = app.Accounts.CreateWithPassword("hashed-twin", "Hashed twin", AccountRole.Viewer, "a-password-to-hash", null, Engineer);

        var bytes = Convert.FromBase64String(account.PasswordHash);

        Assert.DoesNotContain("a-password-to-hash", account.PasswordHash, StringComparison.Ordinal);
        // from memory: ASP.NET Core Identity's version-3 hash starts with the marker byte 0x01 (PBKDF2, 128-bit salt, 256-bit subkey).
        Assert.Equal(0x01, bytes[0]);
        Assert.NotEqual(account.PasswordHash, twin.PasswordHash);
        Assert.Equal(PasswordVerificationResult.Success,
            new PasswordHasher<Account>().VerifyHashedPassword(account, account.PasswordHash, "a-password-to-hash"));
    }

    [Fact]
    public void The_last_enabled_engineer_can_be_neither_demoted_nor_disabled()
    {
        var demote = Assert.Throws<Storage.Errors.AccountException>(() => app.Accounts.SetRole("admin", AccountRole.Operator, Engineer));
        var disable = Assert.Throws<Storage.Errors.AccountException>(() => app.Accounts.Disable("admin", Engineer));

        Assert.Equal("role", demote.Field);
        Assert.Equal("status", disable.Field);
        Assert.Equal(AccountRole.Engineer, app.Accounts.Find("admin")!.Role);
    }
}
