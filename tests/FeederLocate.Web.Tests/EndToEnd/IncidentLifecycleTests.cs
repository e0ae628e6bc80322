using System.Text.RegularExpressions;
using FeederLocate.Web.Tests.Support;
using Microsoft.Playwright;

namespace FeederLocate.Web.Tests.EndToEnd;

/// <summary>Checked switching and the incident's lifecycle in a real headless Chromium against the app on a loopback port.</summary>
public sealed class IncidentLifecycleTests(WebAppFixture app) : IClassFixture<WebAppFixture>
{
    private const string SolidGrid = "Marrowdell 20 kV (solidly grounded)";

    [Fact]
    public async Task An_operator_is_refused_a_tick_out_of_order_corrects_a_tick_confirms_a_switch_and_takes_the_incident_to_closed()
    {
        var page = await app.SignedInPage("ana", "ana-password-1", "/", new BrowserNewPageOptions { ViewportSize = new ViewportSize { Width = 1600, Height = 1100 } });
        await WaitForCircuit(page);
        await page.SelectOptionAsync("[data-testid=new-grid]", SolidGrid);
        await page.SelectOptionAsync("[data-testid=new-tripped]", "CB-A1");
        await page.SelectOptionAsync("[data-testid=new-type]", "LG");
        await page.ClickAsync("[data-testid=open-incident]");
        await app.WaitForPath(page, "/incidents/");
        await WaitForCircuit(page);

        // A reading shows who entered it.
        await page.SelectOptionAsync("[data-testid='state-FPI-A1-04']", "fault");
        await Assertions.Expect(page.Locator("[data-testid='entered-FPI-A1-04']")).ToContainTextAsync("ana (operator) at");

        // Step 3 before steps 1 and 2: refused with the reason, and its box stays unticked.
        await Assertions.Expect(page.Locator("[data-testid=plan-steps] li[data-step='3']")).ToBeVisibleAsync();
        await page.ClickAsync("[data-testid=tick-3]");
        await Assertions.Expect(page.Locator("[data-testid=tick-refusal]")).ToContainTextAsync("step 1 (");
        await Assertions.Expect(page.Locator("[data-testid=tick-refusal]")).ToContainTextAsync("is not done yet: the steps are carried out in order");
        await Assertions.Expect(page.Locator("[data-testid=tick-3]")).Not.ToBeCheckedAsync();
        await Assertions.Expect(page.Locator("[data-testid=done-3]")).ToHaveCountAsync(0);

        // Step 1 ticked, then withdrawn with a reason: the tick is gone from the list (it stays in the log).
        await page.ClickAsync("[data-testid=tick-1]");
        await Assertions.Expect(page.Locator("[data-testid=done-1]")).ToContainTextAsync("done by ana (operator)");
        await page.ClickAsync("[data-testid=correct-1]");
        await page.FillAsync("[data-testid=correct-reason-1]", "crew not yet on site");
        await page.ClickAsync("[data-testid=correct-confirm-1]");
        await Assertions.Expect(page.Locator("[data-testid=done-1]")).ToHaveCountAsync(0);

        // A click on a switch only asks; the position changes once confirmed.
        var sectionaliser = page.Locator("g[data-switch='LB-A1-3']");
        await sectionaliser.ClickAsync();
        await Assertions.Expect(page.Locator("[data-testid=switch-confirmation]")).ToContainTextAsync("Record that LB-A1-3 is found open?");
        await Assertions.Expect(sectionaliser).ToHaveClassAsync(new Regex(@"\bclosed\b"));
        await page.ClickAsync("[data-testid=switch-confirm]");
        await Assertions.Expect(sectionaliser).ToHaveClassAsync(new Regex(@"\bopen\b"));
        await sectionaliser.ClickAsync();
        await page.ClickAsync("[data-testid=switch-confirm]");
        await Assertions.Expect(sectionaliser).ToHaveClassAsync(new Regex(@"\bclosed\b"));

        // From open to closed: located, the outcome, repaired, the return order ticked step by step, closing.
        await page.ClickAsync("[data-testid=stage-located]");
        await Assertions.Expect(page.Locator("[data-testid=stage]")).ToHaveTextAsync("located");
        await Assertions.Expect(page.Locator("[data-testid=return-waiting]")).ToBeVisibleAsync();
        await page.SelectOptionAsync("[data-testid=outcome-segment]", "S109");
        await page.ClickAsync("[data-testid=log-outcome]");
        await Assertions.Expect(page.Locator("[data-testid=logged-outcome] [title=S109]")).ToContainTextAsync(" → "); // named by its section; the id is the tooltip
        await Assertions.Expect(page.Locator("[data-testid=return-not-yet]")).ToContainTextAsync("follows the repair");
        await page.ClickAsync("[data-testid=stage-repaired]");
        await Assertions.Expect(page.Locator("[data-testid=off-normal]")).ToContainTextAsync("CB-A1 is open, normally closed");
        await TickReturnOrder(page);
        await Assertions.Expect(page.Locator("[data-testid=all-normal]")).ToBeVisibleAsync();
        await page.ClickAsync("[data-testid=close-incident]");
        await Assertions.Expect(page.Locator("[data-testid=stage]")).ToHaveTextAsync("closed");
        await Assertions.Expect(page.Locator("[data-testid=closed-read-only]")).ToBeVisibleAsync();
        await Assertions.Expect(page.Locator("[data-testid=stage-history] li")).ToHaveCountAsync(4);
        await Assertions.Expect(page.Locator("[data-testid=indicator-entry]")).ToHaveCountAsync(0);

        await page.GotoAsync(app.BaseAddress + "/");
        await WaitForCircuit(page);
        await Assertions.Expect(page.Locator("[data-testid=incident-list]")).ToContainTextAsync("closed");
        await page.CloseAsync();
    }

    [Fact]
    public async Task A_transient_no_fault_found_leads_to_the_return_order_and_closing_and_the_handover_lists_the_open_incident()
    {
        var page = await app.SignedInPage("ana", "ana-password-1", "/", new BrowserNewPageOptions { ViewportSize = new ViewportSize { Width = 1600, Height = 1100 } });
        await WaitForCircuit(page);
        await page.SelectOptionAsync("[data-testid=new-grid]", SolidGrid);
        await page.SelectOptionAsync("[data-testid=new-tripped]", "CB-A1");
        await page.SelectOptionAsync("[data-testid=new-type]", "LL");
        await page.ClickAsync("[data-testid=open-incident]");
        await app.WaitForPath(page, "/incidents/");
        await WaitForCircuit(page);
        var id = page.Url[(page.Url.LastIndexOf('/') + 1)..];

        // A reading with its own time, typed on the desk.
        var readAt = DateTimeOffset.UtcNow.AddMinutes(-1).ToString("HH:mm", System.Globalization.CultureInfo.InvariantCulture);
        await page.FillAsync("[data-testid=quick-indicator]", "FPI-A1-04");
        await page.FillAsync("[data-testid=quick-state]", "fault");
        await page.FillAsync("[data-testid=quick-read-at]", readAt);
        await page.ClickAsync("[data-testid=quick-enter]");
        await Assertions.Expect(page.Locator("[data-testid=quick-message]")).ToContainTextAsync($"read at {readAt} UTC");
        await Assertions.Expect(page.Locator("tr[data-indicator-row='FPI-A1-04']")).ToContainTextAsync($"{readAt}:00");

        // The handover lists the open incident with its stage and next step.
        await page.ClickAsync("[data-testid=nav-handover]");
        await app.WaitForPath(page, "/handover");
        await Assertions.Expect(page.Locator($"[data-testid=handover-{id}]")).ToBeVisibleAsync(new LocatorAssertionsToBeVisibleOptions { Timeout = 30_000 });
        await Assertions.Expect(page.Locator($"[data-testid=handover-stage-{id}]")).ToContainTextAsync("open");
        await Assertions.Expect(page.Locator($"[data-testid=handover-next-{id}]")).ToContainTextAsync("1. ");
        await Assertions.Expect(page.Locator($"[data-testid=handover-questions-{id}]")).ToContainTextAsync("Unread indicators:");
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(Path.GetTempPath(), "feederlocate-handover.png") });
        await page.EmulateMediaAsync(new PageEmulateMediaOptions { Media = Media.Print });
        await Assertions.Expect(page.Locator("header.top")).ToBeHiddenAsync();
        await page.EmulateMediaAsync(new PageEmulateMediaOptions { Media = Media.Screen });

        // No fault found, transient: the form offers the incident's fault type; no repair is needed before the return.
        await page.GotoAsync(app.BaseAddress + "/incidents/" + id);
        await WaitForCircuit(page);
        await Assertions.Expect(page.Locator("[data-testid=outcome-type]")).ToHaveValueAsync("LL");
        await page.SelectOptionAsync("[data-testid=outcome-finding]", "transient");
        await page.ClickAsync("[data-testid=log-outcome]");
        await Assertions.Expect(page.Locator("[data-testid=logged-outcome]")).ToContainTextAsync("no fault found (transient");
        await TickReturnOrder(page);
        await page.ClickAsync("[data-testid=close-incident]");
        await Assertions.Expect(page.Locator("[data-testid=stage]")).ToHaveTextAsync("closed");

        await page.GotoAsync(app.BaseAddress + "/");
        await WaitForCircuit(page);
        await Assertions.Expect(page.Locator($"tr[data-incident='{id}']")).ToContainTextAsync("none found (transient)");
        await page.CloseAsync();
    }

    /// <summary>Ticks every step of the return order in order, waiting for each to show who did it.</summary>
    private static async Task TickReturnOrder(IPage page)
    {
        var boxes = page.Locator("[data-testid=return-steps] li[data-return-step]");
        await Assertions.Expect(boxes.First).ToBeVisibleAsync(new LocatorAssertionsToBeVisibleOptions { Timeout = 30_000 });
        var orders = await boxes.EvaluateAllAsync<int[]>("items => items.map(i => Number(i.dataset.returnStep))");
        Assert.NotEmpty(orders);
        foreach (var order in orders)
        {
            await page.ClickAsync($"[data-testid=return-tick-{order}]");
            await Assertions.Expect(page.Locator($"[data-testid=return-done-{order}]")).ToContainTextAsync("done by ana (operator)");
        }
    }

    private static Task WaitForCircuit(IPage page) =>
        page.Locator("[data-testid=interactive]").WaitForAsync(new LocatorWaitForOptions { Timeout = 30_000 });
}
