using System.Text.Json;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Services;
using FeederLocate.Web.Tests.Support;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Playwright;

namespace FeederLocate.Web.Tests.EndToEnd;

/// <summary>
/// The desk at 1920×1080 and 1366×768 and the field page at 390×844, in Chromium: what is on screen without
/// scrolling, labels measured from the SVG's own boxes, the History charts, a reading from the phone at the desk.
/// </summary>
public sealed class DeskLayoutTests(WebAppFixture app) : IClassFixture<WebAppFixture>
{
    private const string SolidGrid = "Marrowdell 20 kV (solidly grounded)";
    private static readonly Actor Setup = new("ana", "operator");

    public static TheoryData<int, int> DeskSizes => new() { { 1920, 1080 }, { 1366, 768 } };

    [Theory]
    [MemberData(nameof(DeskSizes))]
    public async Task The_diagram_the_suspects_the_next_step_and_evidence_entry_are_on_screen_together(int width, int height)
    {
        var id = OpenIncident(SolidGrid, "CB-A1", FaultType.LG,
            ("FPI-A1-01", IndicatorState.Forward), ("FPI-A1-04", IndicatorState.Fault), ("FPI-A1-11", IndicatorState.Forward), ("FPI-A1-14", IndicatorState.None));
        var page = await app.SignedInPage("ana", "ana-password-1", $"/incidents/{id}", Size(width, height));
        await WaitForCircuit(page);
        await Assertions.Expect(page.Locator("[data-testid=ranked-list] ol.sections li").First).ToBeVisibleAsync();

        foreach (var part in new[] { "oneline", "ranked-list", "next-step", "indicator-quick-entry" })
        {
            var box = await page.Locator($"[data-testid={part}]").First.BoundingBoxAsync();
            Assert.NotNull(box);
            Assert.True(box.Y >= 0 && box.X >= 0 && box.Y + Math.Min(box.Height, 120) <= height && box.X + box.Width <= width,
                $"{part} at ({box.X:0}, {box.Y:0}) size {box.Width:0}×{box.Height:0} is not within {width}×{height}");
        }

        var diagram = await page.Locator("[data-testid=oneline]").BoundingBoxAsync();
        Assert.True(diagram!.Y + diagram.Height <= height && diagram.Height >= height * 0.4, $"the diagram is {diagram.Height:0} px high at {diagram.Y:0}");
        Assert.Equal(0, await page.EvaluateAsync<double>("() => window.scrollY"));
        Assert.True(await page.EvaluateAsync<bool>("() => document.documentElement.scrollWidth <= window.innerWidth"), "the page scrolls sideways");

        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Shot($"desk-{width}x{height}.png") });
        await page.CloseAsync();
    }

    [Theory]
    [MemberData(nameof(DeskSizes))]
    public async Task No_two_labels_of_a_sample_grid_overlap_and_every_label_is_legible_as_one_zooms(int width, int height)
    {
        var id = OpenIncident(SolidGrid, "CB-B1", FaultType.LG, ("FPI-B1-01", IndicatorState.Forward));
        var page = await app.SignedInPage("ana", "ana-password-1", $"/incidents/{id}", Size(width, height));
        await WaitForCircuit(page);
        await Assertions.Expect(page.Locator("[data-testid=oneline] text.label").First).ToBeVisibleAsync();

        await AssertLabelsClear(page, "opened");
        for (var k = 0; k < 3; k++)
        {
            await page.ClickAsync("[aria-label='Zoom out']");
            await AssertLabelsClear(page, $"zoomed out {k + 1}×");
        }

        await page.ClickAsync("[aria-label='Whole network']");
        await AssertLabelsClear(page, "whole network");
        for (var k = 0; k < 5; k++)
        {
            await page.ClickAsync("[aria-label='Zoom in']");
            await AssertLabelsClear(page, $"zoomed in {k + 1}×");
        }

        await page.CloseAsync();
    }

    [Fact]
    public async Task No_two_labels_of_a_generated_10000_segment_grid_overlap()
    {
        var grids = app.Services.GetRequiredService<GridCatalog>();
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(10_000, Seed: 11));
        if (grids.Find(grid.Name) is null)
        {
            Assert.DoesNotContain(grids.Load("generated-10000.grid.json", FeederLocate.Core.Formats.GridWriter.Write(grid), new FeederLocate.Storage.Events.Actor("layout-test", "engineer")).Issues, i => i.Severity == FeederLocate.Core.Formats.Severity.Error);
        }

        var loaded = grids.Find(grid.Name)!;
        var breaker = grid.Switches.First(s => s.Kind == SwitchKind.Breaker).Id;
        var board = app.Services.GetRequiredService<IncidentBoard>();
        var id = board.Open(loaded, breaker, FaultType.LLL, DateTimeOffset.UtcNow, Setup);
        var page = await app.SignedInPage("ana", "ana-password-1", $"/incidents/{id.Value}", Size(1920, 1080));
        await WaitForCircuit(page);
        await Assertions.Expect(page.Locator("[data-testid=oneline] text.label").First).ToBeVisibleAsync(new LocatorAssertionsToBeVisibleOptions { Timeout = 60_000 });

        await AssertLabelsClear(page, "opened");
        foreach (var (button, times) in new[] { ("Zoom out", 2), ("Whole network", 1), ("Zoom in", 6) })
        {
            for (var k = 0; k < times; k++)
            {
                await page.ClickAsync($"[aria-label='{button}']");
                await AssertLabelsClear(page, $"{button} {k + 1}×");
            }
        }

        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Shot("desk-10000-segments.png") });
        await page.CloseAsync();
    }

    [Fact]
    public async Task The_history_charts_draw()
    {
        var grids = app.Services.GetRequiredService<GridCatalog>();
        var board = app.Services.GetRequiredService<IncidentBoard>();
        var grid = grids.Default!;
        var id = board.Open(grid, grid.Grid.Switches.First(s => s.Kind == SwitchKind.Breaker).Id, FaultType.LG, DateTimeOffset.UtcNow, Setup);
        board.Append(id, new OutcomeLogged(grid.Grid.Segments[3].Id, FaultType.LG, "test", null), Setup);

        var page = await app.SignedInPage("ana", "ana-password-1", "/history", Size(1366, 768));
        await WaitForCircuit(page);

        // Indicator performance, faults per section and the grid's measured learning curve.
        await Assertions.Expect(page.Locator("canvas[data-drawn=true]")).ToHaveCountAsync(3);
        await page.CloseAsync();
    }

    [Fact]
    public async Task A_reading_entered_on_the_phone_appears_at_the_desk()
    {
        var id = OpenIncident(SolidGrid, "CB-A2", FaultType.LG);
        var desk = await app.SignedInPage("ben", "ben-password-1", $"/incidents/{id}", Size(1920, 1080));
        await WaitForCircuit(desk);
        var phone = await app.SignedInPage("ana", "ana-password-1", $"/incidents/{id}/field", new BrowserNewPageOptions
        {
            ViewportSize = new ViewportSize { Width = 390, Height = 844 }, IsMobile = true, HasTouch = true, DeviceScaleFactor = 2,
        });
        await WaitForCircuit(phone);

        Assert.True(await phone.EvaluateAsync<bool>("() => document.documentElement.scrollWidth <= 390"), "the phone page is wider than the phone");
        await Assertions.Expect(phone.Locator("nav a[href='history']").Or(phone.Locator("nav a[href='/history']"))).ToBeInViewportAsync();
        await Assertions.Expect(phone.Locator("[data-testid=field-unread] button").First).ToBeVisibleAsync();
        // Each unread indicator says what kind it is and where it is, by section name ("field indicator · on A1: …").
        await Assertions.Expect(phone.Locator("[data-testid=field-unread] button").First).ToContainTextAsync(new System.Text.RegularExpressions.Regex(@"(field indicator|remote, not reported) · on [A-Z0-9]+: "));
        var smallest = await phone.EvaluateAsync<double>("() => Math.min(...[...document.querySelectorAll('[data-testid=field-page] button, nav a')].map(e => e.getBoundingClientRect()).filter(r => r.width > 0).map(r => Math.min(r.width, r.height)))");
        Assert.True(smallest >= 44, $"a tap target is {smallest:0} px");

        await phone.FillAsync("[data-testid=field-search]", "FPI-A2-08");
        await phone.ClickAsync("[data-testid=field-matches] button");
        // Where it is, in the operator's words: the section by feeder and bounding devices; the segment id is the tooltip.
        await Assertions.Expect(phone.Locator("[data-testid=field-place]")).ToContainTextAsync("on A2: ");
        await Assertions.Expect(phone.Locator("[data-testid=field-place]")).ToHaveAttributeAsync("title", "S206");
        await phone.ClickAsync("[data-testid=field-state-fault]");
        await phone.FillAsync("[data-testid=field-read-at]", "07:45");
        await phone.ScreenshotAsync(new PageScreenshotOptions { Path = Shot("field-390x844.png") });
        await phone.ClickAsync("[data-testid=field-save]");
        await Assertions.Expect(phone.Locator("[data-testid=field-saved]")).ToContainTextAsync("FPI-A2-08 shows fault, read at 07:45");

        await Assertions.Expect(desk.Locator("[data-testid='state-FPI-A2-08']")).ToHaveValueAsync("fault");
        await phone.CloseAsync();
        await desk.CloseAsync();
    }

    private long OpenIncident(string gridName, string tripped, FaultType type, params (string Indicator, IndicatorState State)[] readings)
    {
        var grid = app.Services.GetRequiredService<GridCatalog>().Find(gridName)!;
        var board = app.Services.GetRequiredService<IncidentBoard>();
        var id = board.Open(grid, new SwitchId(tripped), type, DateTimeOffset.UtcNow, Setup);
        foreach (var (indicator, state) in readings)
        {
            board.Append(id, new IndicationEntered(new Indication(new IndicatorId(indicator), state, IndicationSource.Remote, DateTimeOffset.UtcNow)), Setup);
        }

        return id.Value;
    }

    /// <summary>
    /// Every label in the diagram, from the browser's own boxes: no two overlap, none covers a switch or an
    /// indicator symbol, and each is at least 11 px on screen (its font size times the SVG's scale).
    /// </summary>
    private static async Task AssertLabelsClear(IPage page, string when)
    {
        // The server draws for the size the browser last reported; wait until that drawing is on screen.
        try
        {
            await page.WaitForFunctionAsync("""
                () => {
                  const root = document.querySelector('[data-testid=oneline]');
                  const svg = root?.querySelector(':scope > svg');
                  const ctm = svg?.getScreenCTM();
                  return ctm && Math.abs(ctm.a / parseFloat(root.dataset.scale) - 1) < 0.01;
                }
                """, null, new PageWaitForFunctionOptions { Timeout = 30_000 });
        }
        catch (TimeoutException)
        {
            var seen = await page.EvaluateAsync<string>("""
                () => {
                  const root = document.querySelector('[data-testid=oneline]');
                  const svg = root.querySelector(':scope > svg');
                  const r = svg.getBoundingClientRect();
                  return `scale ${root.dataset.scale}, screen ${svg.getScreenCTM()?.a}, viewBox ${svg.getAttribute('viewBox')}, box ${r.width}×${r.height}, ${svg.querySelectorAll('*').length} elements`;
                }
                """);
            Assert.Fail($"{when}: the drawing on screen is not the one drawn for its size: {seen}");
        }

        var json = await page.EvaluateAsync<string>("""
            () => {
              const svg = document.querySelector('[data-testid=oneline] > svg');
              const view = svg.getBoundingClientRect();
              const inView = r => r.right > view.left && r.left < view.right && r.bottom > view.top && r.top < view.bottom;
              const box = e => { const r = e.getBoundingClientRect(); return { l: r.left, t: r.top, r: r.right, b: r.bottom }; };
              const labels = [...svg.querySelectorAll('text.label')].filter(e => inView(e.getBoundingClientRect())).map(e => ({
                text: e.textContent, ...box(e),
                px: parseFloat(getComputedStyle(e).fontSize) * e.getScreenCTM().a }));
              const symbols = [...svg.querySelectorAll('g[data-switch] > rect, g[data-indicator] > circle')]
                .map(e => ({ id: e.parentElement.dataset.switch || e.parentElement.dataset.indicator, ...box(e) }))
                .filter(r => inView({ left: r.l, right: r.r, top: r.t, bottom: r.b }));
              return JSON.stringify({ labels, symbols });
            }
            """);
        var scene = JsonSerializer.Deserialize<Scene>(json, new JsonSerializerOptions(JsonSerializerDefaults.Web))!;
        const double tolerance = 0.5;
        static bool Overlap(Box a, Box b) => a.L < b.R - tolerance && b.L < a.R - tolerance && a.T < b.B - tolerance && b.T < a.B - tolerance;

        foreach (var label in scene.Labels)
        {
            Assert.True(label.Px >= 11, $"{when}: label {label.Text} is {label.Px:0.0} px");
        }

        for (var a = 0; a < scene.Labels.Length; a++)
        {
            for (var b = a + 1; b < scene.Labels.Length; b++)
            {
                Assert.False(Overlap(scene.Labels[a], scene.Labels[b]), $"{when}: labels {scene.Labels[a].Text} and {scene.Labels[b].Text} overlap");
            }

            foreach (var symbol in scene.Symbols)
            {
                Assert.False(Overlap(scene.Labels[a], symbol), $"{when}: label {scene.Labels[a].Text} covers {symbol.Id}");
            }
        }
    }

    private sealed record Scene(Label[] Labels, Symbol[] Symbols);

    private record Box(double L, double T, double R, double B);

    private sealed record Label(string Text, double L, double T, double R, double B, double Px) : Box(L, T, R, B);

    private sealed record Symbol(string Id, double L, double T, double R, double B) : Box(L, T, R, B);

    private static BrowserNewPageOptions Size(int width, int height) => new() { ViewportSize = new ViewportSize { Width = width, Height = height } };

    private string Shot(string name)
    {
        Directory.CreateDirectory(app.ArtifactsFolder);
        return Path.Combine(app.ArtifactsFolder, name);
    }

    private static Task WaitForCircuit(IPage page) =>
        page.Locator("[data-testid=interactive]").WaitForAsync(new LocatorWaitForOptions { Timeout = 60_000 });
}
