using System.Net;
using System.Net.Http.Headers;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Services;
using FeederLocate.Web.Tests.Support;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Playwright;

namespace FeederLocate.Web.Tests.EndToEnd;

/// <summary>Roles, tokens and names in a real headless Chromium.</summary>
public sealed class AccessInTheBrowserTests(WebAppFixture app) : IClassFixture<WebAppFixture>
{
    private static Task WaitForCircuit(IPage page) =>
        page.Locator("[data-testid=interactive]").WaitForAsync(new LocatorWaitForOptions { Timeout = 90_000 });

    [Fact]
    public async Task A_viewer_follows_an_incident_without_controls_and_their_name_with_markup_is_shown_as_text()
    {
        var board = app.Services.GetRequiredService<IncidentBoard>();
        var grids = app.Services.GetRequiredService<GridCatalog>();
        var solid = grids.Find("Marrowdell 20 kV (solidly grounded)")!;
        var id = board.Open(solid, new SwitchId("CB-A1"), FaultType.LG, DateTimeOffset.UtcNow, new Actor("ana", "operator"));

        var page = await app.SignedInPage("vera", "vera-password-1", $"/incidents/{id}");
        await WaitForCircuit(page);

        await Assertions.Expect(page.Locator("[data-testid=read-only]")).ToBeVisibleAsync();
        Assert.Equal(0, await page.Locator("[data-testid^='state-']").CountAsync());
        Assert.Equal(0, await page.Locator("[data-testid=log-outcome]").CountAsync());
        await IncidentWorkflowTests.ShowOnDiagram(page, "FPI-A1-04");
        await page.Locator("g[data-indicator='FPI-A1-04']").ClickAsync();
        Assert.Single(board.Events(new Storage.Incidents.IncidentId(id.Value)));

        var shown = await page.Locator("[data-testid=signed-in-as]").InnerTextAsync();
        Assert.Contains("<img src=x onerror=alert(1)>Vera", shown, StringComparison.Ordinal);
        Assert.Equal(0, await page.Locator("header img").CountAsync());

        // The operator's change reaches the viewer's page without reloading.
        board.Append(id, new IndicationEntered(new Indication(new IndicatorId("FPI-A1-04"), IndicatorState.Fault, IndicationSource.Remote, DateTimeOffset.UtcNow, false)),
            new Actor("ana", "operator"));
        await Assertions.Expect(page.Locator("g[data-indicator='FPI-A1-04']")).ToHaveAttributeAsync("data-state", "fault");
        await page.CloseAsync();
    }

    [Fact]
    public async Task An_engineer_issues_a_token_on_the_accounts_page_that_works_until_revoked_there()
    {
        var page = await app.SignedInPage("admin", WebAppFixture.AdministratorPassword, "/accounts");
        await WaitForCircuit(page);
        await page.SelectOptionAsync("[data-testid=token-account]", "ben");
        await page.FillAsync("[data-testid=token-label]", "gateway in test");
        await page.ClickAsync("[data-testid=issue-token]");
        var secret = (await page.Locator("[data-testid=secret]").InnerTextAsync()).Trim();
        using var api = new HttpClient { BaseAddress = new Uri(app.BaseAddress) };
        api.DefaultRequestHeaders.Authorization = new AuthenticationHeaderValue("Bearer", secret);

        var before = await api.GetAsync("/api/grids");
        var row = page.Locator("[data-testid=token-list] tr", new PageLocatorOptions { HasText = "gateway in test" });
        await row.Locator("button", new LocatorLocatorOptions { HasText = "Revoke" }).ClickAsync();
        await Assertions.Expect(row).ToContainTextAsync("revoked");
        var after = await api.GetAsync("/api/grids");

        Assert.Equal(HttpStatusCode.OK, before.StatusCode);
        Assert.Equal(HttpStatusCode.Unauthorized, after.StatusCode);
        await page.CloseAsync();
    }

    [Fact]
    public async Task An_account_created_on_the_accounts_page_signs_in_with_its_one_time_password_and_must_choose_its_own()
    {
        var page = await app.SignedInPage("admin", WebAppFixture.AdministratorPassword, "/accounts");
        await WaitForCircuit(page);
        await page.FillAsync("[data-testid=new-account-name]", "cleo");
        await page.FillAsync("[data-testid=new-account-display]", "Cleo Night");
        await page.SelectOptionAsync("[data-testid=new-account-role]", "Viewer");
        await page.ClickAsync("[data-testid=create-account]");
        var oneTime = (await page.Locator("[data-testid=secret]").InnerTextAsync()).Trim();
        await Assertions.Expect(page.Locator("[data-testid=account-list] tr[data-account='cleo']")).ToContainTextAsync("password to set");

        var cleo = await app.SignedInPage("cleo", oneTime);

        await Assertions.Expect(cleo.Locator("[data-testid=must-change]")).ToBeVisibleAsync();
        await cleo.FillAsync("[data-testid=current-password]", oneTime);
        await cleo.FillAsync("[data-testid=new-password]", "cleo-own-password");
        await cleo.FillAsync("[data-testid=confirm-password]", "cleo-own-password");
        await cleo.ClickAsync("[data-testid=change-password]");
        await WaitForCircuit(cleo);
        await Assertions.Expect(cleo.Locator("[data-testid=signed-in-as]")).ToContainTextAsync("Cleo Night · viewer");
        await page.CloseAsync();
        await cleo.CloseAsync();
    }
}
