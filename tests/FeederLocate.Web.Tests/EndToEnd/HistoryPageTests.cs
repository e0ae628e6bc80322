using FeederLocate.Web.Tests.Support;
using Microsoft.Playwright;

namespace FeederLocate.Web.Tests.EndToEnd;

/// <summary>The History page in a real headless Chromium: what the history has taught, and the measured learning curve.</summary>
public sealed class HistoryPageTests(WebAppFixture app) : IClassFixture<WebAppFixture>
{
    private const string SolidGrid = "Marrowdell 20 kV (solidly grounded)";

    [Fact]
    public async Task After_an_outcome_the_history_page_shows_the_chosen_prior_strengths_the_measurement_ratios_and_the_learning_curve()
    {
        var page = await app.SignedInPage("ana", "ana-password-1", "/", new BrowserNewPageOptions { ViewportSize = new ViewportSize { Width = 1600, Height = 1100 } });
        await WaitForCircuit(page);
        await page.SelectOptionAsync("[data-testid=new-grid]", SolidGrid);
        await page.SelectOptionAsync("[data-testid=new-tripped]", "CB-A1");
        await page.SelectOptionAsync("[data-testid=new-type]", "LG");
        await page.ClickAsync("[data-testid=open-incident]");
        await app.WaitForPath(page, "/incidents/");
        await WaitForCircuit(page);
        // A breaker record (the sample incident's 1880 A at CB-A1), so the history has a measurement to compare.
        await page.GetByLabel("breaker", new() { Exact = true }).SelectOptionAsync("CB-A1");
        await page.GetByLabel("phase current A").FillAsync("1880");
        await page.GetByRole(AriaRole.Button, new() { Name = "Enter record" }).ClickAsync();
        await page.SelectOptionAsync("[data-testid=outcome-segment]", "S109");
        await page.ClickAsync("[data-testid=log-outcome]");
        await Assertions.Expect(page.Locator("[data-testid=logged-outcome] [title=S109]")).ToContainTextAsync(" → "); // named by its section; the id is the tooltip

        await page.GotoAsync(app.BaseAddress + "/history");
        await WaitForCircuit(page);
        await page.SelectOptionAsync("[data-testid=history-grid]", SolidGrid);

        // One outcome: the overhead and cable types each get a prior chosen by the data (one fault is little, so the
        // strength is allowed anywhere within its bounds); the curve is the one measured in sample-grid/learning-curves.json.
        var priors = page.Locator("[data-testid=fault-rate-priors]");
        await Assertions.Expect(priors).ToContainTextAsync("by the data");
        await Assertions.Expect(page.Locator("[data-testid=indicator-priors]")).ToContainTextAsync("false report");
        await Assertions.Expect(page.Locator("[data-testid=measurement-ratios]")).ToContainTextAsync("phase current");
        await Assertions.Expect(page.Locator("[data-testid=learning-curve] canvas")).ToBeVisibleAsync();
        await Assertions.Expect(page.Locator("[data-testid=learning-curve] table")).ToContainTextAsync("told the truth");
        await page.CloseAsync();
    }

    /// <summary>Prerendered controls arrive before the circuit; wait until the page is interactive.</summary>
    private static Task WaitForCircuit(IPage page) =>
        page.Locator("[data-testid=interactive]").WaitForAsync(new LocatorWaitForOptions { Timeout = 30_000 });
}
