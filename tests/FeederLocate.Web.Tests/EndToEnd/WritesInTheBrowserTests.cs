using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Services;
using FeederLocate.Web.Tests.Support;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Playwright;

namespace FeederLocate.Web.Tests.EndToEnd;

/// <summary>
/// Refused and failed writes in a real headless Chromium: the operator is told the change was not saved, the
/// control goes back to what the log holds, and the page stays connected. Its own app and database: the file is deleted.
/// </summary>
public sealed class WritesInTheBrowserTests(WebAppFixture app) : IClassFixture<WebAppFixture>
{
    [Fact]
    public async Task A_loop_is_refused_and_a_change_the_log_cannot_write_is_shown_unsaved_with_the_select_back_on_the_stored_state()
    {
        var board = app.Services.GetRequiredService<IncidentBoard>();
        var grids = app.Services.GetRequiredService<GridCatalog>();
        var solid = grids.All.Single(g => g.Grid.Name.Contains("solid", StringComparison.Ordinal));
        var id = board.Open(solid, new SwitchId("CB-A1"), FaultType.LG, new DateTimeOffset(2026, 11, 30, 6, 12, 0, TimeSpan.Zero), new Actor("ana", "operator"));
        var page = await app.SignedInPage("ana", "ana-password-1", $"/incidents/{id}", new BrowserNewPageOptions { ViewportSize = new ViewportSize { Width = 1600, Height = 1100 } });
        await page.Locator("[data-testid=interactive]").WaitForAsync(new LocatorWaitForOptions { Timeout = 30_000 });
        await Assertions.Expect(page.Locator("[data-testid=ranked-list]")).ToBeVisibleAsync();

        // NO-A1-A2 ties two fed feeders of the demo grid: closing it makes a loop, which is refused.
        await page.Locator("g[data-switch='NO-A1-A2']").DispatchEventAsync("click");
        // A switch click only asks; the position is recorded once confirmed.
        await page.Locator("[data-testid=switch-confirm]").ClickAsync();
        await Assertions.Expect(page.Locator("[data-testid=not-saved]")).ToContainTextAsync("radial");
        await Assertions.Expect(page.Locator("g[data-switch='NO-A1-A2']")).ToHaveClassAsync(new System.Text.RegularExpressions.Regex(@"\bopen\b"));

        File.Delete(board.DatabasePath);
        await page.SelectOptionAsync("[data-testid='state-FPI-A1-04']", "fault");

        await Assertions.Expect(page.Locator("[data-testid=not-saved]")).ToContainTextAsync("nothing more is saved");
        await Assertions.Expect(page.Locator("[data-testid='state-FPI-A1-04']")).ToHaveValueAsync("unknown");
        await Assertions.Expect(page.Locator("g[data-indicator='FPI-A1-04']")).ToHaveAttributeAsync("data-state", "unknown");
        await Assertions.Expect(page.Locator("[data-testid=interactive]")).ToBeVisibleAsync();
        Assert.Equal(["incidentOpened"], board.Events(id).Select(e => e.Kind));
        await page.CloseAsync();
    }
}
