using FeederLocate.Web.Tests.Support;
using Microsoft.Playwright;

namespace FeederLocate.Web.Tests.EndToEnd;

/// <summary>The operator's workflow in a real headless Chromium against the app on a loopback port.</summary>
public sealed class IncidentWorkflowTests(WebAppFixture app) : IClassFixture<WebAppFixture>
{
    private const string SolidGrid = "Marrowdell 20 kV (solidly grounded)";

    [Fact]
    public async Task Operator_opens_an_incident_enters_indications_sees_the_suspect_ranked_first_and_the_outcome_is_kept()
    {
        var page = await app.SignedInPage("ana", "ana-password-1", "/", new BrowserNewPageOptions { ViewportSize = new ViewportSize { Width = 1600, Height = 1100 } });
        await WaitForCircuit(page);

        await page.SelectOptionAsync("[data-testid=new-grid]", SolidGrid);
        await page.SelectOptionAsync("[data-testid=new-tripped]", "CB-A1");
        await page.SelectOptionAsync("[data-testid=new-type]", "LG");
        await page.ClickAsync("[data-testid=open-incident]");
        await app.WaitForPath(page, "/incidents/");
        await WaitForCircuit(page);

        // An earth fault on S109 of feeder A1 (solid grounding): the indicators on the way see it, the one beyond does not.
        await SetState(page, "FPI-A1-01", "forward");
        await SetState(page, "FPI-A1-04", "fault");
        await SetState(page, "FPI-A1-11", "forward");
        await SetState(page, "FPI-A1-14", "none");

        var first = page.Locator("[data-testid=ranked-list] ol.sections li").First;
        await Assertions.Expect(first).ToHaveAttributeAsync("data-section", "SEC-S108");
        await Assertions.Expect(page.Locator("g[data-section-label='SEC-S108'] text")).ToBeVisibleAsync();
        await Assertions.Expect(page.Locator("g[data-indicator='FPI-A1-04']")).ToHaveAttributeAsync("data-state", "fault");

        // Tick the first switching step: it is logged with who and when, and the diagram follows it.
        var step = page.Locator("[data-testid=plan-steps] li[data-step='1']");
        await Assertions.Expect(step).ToBeVisibleAsync();
        var action = (await step.Locator(".action").InnerTextAsync()).Trim();
        var device = (await step.Locator(".device").InnerTextAsync()).Trim();
        await page.ClickAsync("[data-testid=tick-1]");
        await Assertions.Expect(page.Locator("[data-testid=done-1]")).ToContainTextAsync("done by ana (operator)");
        if (action is "open" or "close")
        {
            await Assertions.Expect(page.Locator($"g[data-switch='{device}']")).ToHaveClassAsync(new System.Text.RegularExpressions.Regex(action == "open" ? @"\bopen\b" : @"\bclosed\b"));
        }

        Directory.CreateDirectory(app.ArtifactsFolder);
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(app.ArtifactsFolder, "workspace.png"), FullPage = true });

        await page.SelectOptionAsync("[data-testid=outcome-segment]", "S109");
        await page.ClickAsync("[data-testid=log-outcome]");
        await Assertions.Expect(page.Locator("[data-testid=logged-outcome] [title=S109]")).ToContainTextAsync(" → "); // named by its section; the id is the tooltip

        await page.ReloadAsync();
        await WaitForCircuit(page);
        await Assertions.Expect(page.Locator("[data-testid=logged-outcome] [title=S109]")).ToContainTextAsync(" → "); // named by its section; the id is the tooltip
        await Assertions.Expect(page.Locator("g[data-indicator='FPI-A1-11']")).ToHaveAttributeAsync("data-state", "forward");
        await Assertions.Expect(page.Locator("[data-testid=done-1]")).ToContainTextAsync("done by ana (operator)");
        await page.CloseAsync();
    }

    [Fact]
    public async Task A_second_operator_sees_the_first_operators_changes_without_reloading()
    {
        var first = await app.SignedInPage("ana", "ana-password-1");
        await WaitForCircuit(first);
        await first.SelectOptionAsync("[data-testid=new-grid]", SolidGrid);
        await first.ClickAsync("[data-testid=open-incident]");
        await app.WaitForPath(first, "/incidents/");
        await WaitForCircuit(first);

        var second = await app.SignedInPage("ben", "ben-password-1", new Uri(first.Url).AbsolutePath);
        await WaitForCircuit(second);
        await SetState(first, "FPI-A2-05", "forward");

        await Assertions.Expect(second.Locator("g[data-indicator='FPI-A2-05']")).ToHaveAttributeAsync("data-state", "forward");
        await first.CloseAsync();
        await second.CloseAsync();
    }

    [Fact]
    public async Task Whoever_is_not_signed_in_gets_the_sign_in_page_with_the_cautions()
    {
        var page = await app.Browser.NewPageAsync();
        await page.GotoAsync(app.BaseAddress + "/incidents/1", new PageGotoOptions { Timeout = 90_000 });

        await Assertions.Expect(page.Locator("[data-testid=sign-in-form]")).ToBeVisibleAsync();
        Assert.Contains("returnUrl=%2Fincidents%2F1", page.Url, StringComparison.Ordinal);
        await Assertions.Expect(page.Locator("[data-testid=cautions]")).ToContainTextAsync("lock and tag");
        await Assertions.Expect(page.Locator("[data-testid=cautions]")).ToContainTextAsync("prove dead");
        await page.CloseAsync();
    }

    [Fact]
    public async Task The_signed_in_page_shows_the_cautions_and_who_is_signed_in()
    {
        var page = await app.SignedInPage("ben", "ben-password-1");
        await WaitForCircuit(page);

        await Assertions.Expect(page.Locator("[data-testid=cautions]")).ToContainTextAsync("prove dead");
        await Assertions.Expect(page.Locator("[data-testid=signed-in-as]")).ToContainTextAsync("Ben Line · operator");
        await page.ClickAsync("[data-testid=sign-out]");
        await Assertions.Expect(page.Locator("[data-testid=signed-out]")).ToBeVisibleAsync();
        await page.CloseAsync();
    }

    /// <summary>Prerendered controls arrive before the circuit; wait until the page is interactive.</summary>
    private static Task WaitForCircuit(IPage page) =>
        page.Locator("[data-testid=interactive]").WaitForAsync(new LocatorWaitForOptions { Timeout = 30_000 });

    private static async Task SetState(IPage page, string indicator, string state)
    {
        await page.SelectOptionAsync($"[data-testid='state-{indicator}']", state);
        await ShowOnDiagram(page, indicator);
        await Assertions.Expect(page.Locator($"g[data-indicator='{indicator}']")).ToHaveAttributeAsync("data-state", state);
    }

    /// <summary>The diagram draws only what is in view: find the element with the diagram's search first.</summary>
    internal static async Task ShowOnDiagram(IPage page, string id)
    {
        await page.FillAsync("[data-testid=diagram-search]", id);
        await Assertions.Expect(page.Locator("[data-testid=search-matches] button").First).ToContainTextAsync(id);
        await page.PressAsync("[data-testid=diagram-search]", "Enter");
    }
}
