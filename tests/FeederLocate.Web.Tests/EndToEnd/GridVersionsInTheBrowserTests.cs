using System.Text;
using System.Text.Json.Nodes;
using FeederLocate.Core.Formats;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Tests.Support;
using Microsoft.Playwright;

namespace FeederLocate.Web.Tests.EndToEnd;

/// <summary>Grid versions in a real headless Chromium: a grid loaded on the Grids page and an incident on it survive a restart on the same database file.</summary>
public sealed class GridVersionsInTheBrowserTests(WebAppFixture app) : IClassFixture<WebAppFixture>
{
    private static readonly BrowserNewPageOptions Wide = new() { ViewportSize = new ViewportSize { Width = 1600, Height = 1100 } };

    private static FilePayload File(string text) => new() { Name = "brackenfold.grid.json", MimeType = "application/json", Buffer = Encoding.UTF8.GetBytes(text) };

    private static Task WaitForCircuit(IPage page) =>
        page.Locator("[data-testid=interactive]").WaitForAsync(new LocatorWaitForOptions { Timeout = 30_000 });

    [Fact]
    public async Task A_grid_version_pinned_across_a_restart()
    {
        app.Accounts.CreateWithPassword("gina", "Gina Grid", AccountRole.Engineer, "gina-password-1", null, new Actor("admin", "engineer"));
        var original = GridWriter.Write(TestGrids.Brackenfold());
        var withoutFi3 = JsonNode.Parse(original)!.AsObject();
        withoutFi3["indicators"]!.AsArray().RemoveAt(2);

        // Version 1 loaded on the Grids page, an incident opened on it from the board.
        var page = await app.SignedInPage("gina", "gina-password-1", "/grids", Wide);
        await WaitForCircuit(page);
        await page.SetInputFilesAsync("[data-testid=grid-file]", File(original));
        await Assertions.Expect(page.Locator("[data-testid=grid-loaded]")).ToContainTextAsync("as version 1");
        await page.GotoAsync($"{app.BaseAddress}/");
        await WaitForCircuit(page);
        await page.SelectOptionAsync("[data-testid=new-grid]", TestGrids.BrackenfoldName);
        await page.SelectOptionAsync("[data-testid=new-tripped]", "CB1");
        await page.SelectOptionAsync("[data-testid=new-type]", "LG");
        await page.ClickAsync("[data-testid=open-incident]");
        await app.WaitForPath(page, "/incidents/");
        var incidentPath = new Uri(page.Url).AbsolutePath;

        // Version 2 (FI3 taken out) only after confirming with a reason.
        await page.GotoAsync($"{app.BaseAddress}/grids");
        await WaitForCircuit(page);
        await page.SetInputFilesAsync("[data-testid=grid-file]", File(withoutFi3.ToJsonString()));
        await Assertions.Expect(page.Locator("[data-testid=grid-replace]")).ToContainTextAsync("indicator FI3");
        await page.FillAsync("[data-testid=grid-replace-reason]", "FI3 taken out of service");
        await page.ClickAsync("[data-testid=grid-replace-confirm]");
        await Assertions.Expect(page.Locator("[data-testid=grid-loaded]")).ToContainTextAsync("as version 2");
        await page.CloseAsync();

        await app.RestartAsync();

        // After the restart the grid is still there with both versions, and the incident answers on version 1.
        page = await app.SignedInPage("gina", "gina-password-1", "/grids", Wide);
        await WaitForCircuit(page);
        await Assertions.Expect(page.Locator($"[data-testid=grid-list] tr[data-grid='{TestGrids.BrackenfoldName}']")).ToContainTextAsync("2");
        await page.ClickAsync($"[data-testid=grid-list] tr[data-grid='{TestGrids.BrackenfoldName}'] button");
        await Assertions.Expect(page.Locator("[data-testid=grid-versions] tr[data-version]")).ToHaveCountAsync(2);
        await Assertions.Expect(page.Locator("[data-testid=grid-versions] tr[data-version='2']")).ToContainTextAsync("FI3 taken out of service");

        await page.GotoAsync($"{app.BaseAddress}{incidentPath}");
        await WaitForCircuit(page);
        await Assertions.Expect(page.Locator("[data-testid=grid-pinned-version]")).ToHaveTextAsync("Grid version 1");
        await Assertions.Expect(page.Locator("[data-testid=grid-newer]")).ToContainTextAsync("version 2 is stored");
        await Assertions.Expect(page.Locator("g[data-indicator='FI3']")).ToHaveCountAsync(1);
        await Assertions.Expect(page.Locator("li[data-section]").First).ToBeVisibleAsync();
        Directory.CreateDirectory(app.ArtifactsFolder);
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(app.ArtifactsFolder, "grid-version-pinned.png") });

        // The engineer moves it with a reason: now on version 2, without FI3.
        await page.FillAsync("[data-testid=grid-move-reason]", "FI3 is out of service");
        await page.ClickAsync("[data-testid=grid-move]");
        await Assertions.Expect(page.Locator("[data-testid=grid-pinned-version]")).ToHaveTextAsync("Grid version 2");
        await Assertions.Expect(page.Locator("g[data-indicator='FI3']")).ToHaveCountAsync(0);
        await Assertions.Expect(page.Locator("[data-testid=grid-moves]")).ToContainTextAsync("moved from version 1 to 2 by gina");
    }
}
