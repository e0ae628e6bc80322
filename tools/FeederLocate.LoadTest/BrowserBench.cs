using System.Diagnostics;
using System.Globalization;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Synthetic;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;
using FeederLocate.Web;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;
using Microsoft.AspNetCore.Builder;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Playwright;

namespace FeederLocate.LoadTest;

/// <summary>
/// <c>feederlocate-loadtest browser</c>: the one-line view as an operator meets it, in headless Chromium
/// (Debian's, at /usr/bin/chromium) against the app served in this process (build it with -c Release) on a
/// generated grid. Each round opens an incident twice — with the board's "Open incident" button, and by
/// its address with simulated evidence, each time until its switching order is shown, so that one opening
/// does not pay for the planning of the one before — then zooms out and in with the buttons and pans by
/// dragging. Times are taken in the page (performance.now, watching the document's changes): from the click,
/// or from the navigation's start, to the next frame after the ranked suspects and the labelled view are in
/// the document, and from a step to the next frame after the drawing changed; "settled" is when the server's drawing for the new view is on screen. A benchmark: it reports
/// median and slowest, it asserts nothing.
/// </summary>
internal static class BrowserBench
{
    private const string Chromium = "/usr/bin/chromium";
    private const string Password = "bench-operator-password-1";
    private static readonly Actor Setup = new("bench", "operator");

    public static async Task<int> RunAsync(int segments, int seed, int rounds, TextWriter output)
    {
        var folder = Directory.CreateTempSubdirectory("feederlocate-browser-").FullName;
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed));
        await File.WriteAllTextAsync(Path.Combine(folder, "generated.grid.json"), GridWriter.Write(grid));
        var clock = Stopwatch.StartNew();
        var app = FeederLocateWebApp.Build(
        [
            "--urls=http://127.0.0.1:0",
            "--environment=Production",
            $"--FeederLocate:DatabasePath={Path.Combine(folder, "incidents.db")}",
            $"--FeederLocate:GridFolder={folder}",
            "--FeederLocate:DefaultGrid=generated.grid.json",
            "--FeederLocate:AdministratorPassword=bench-administrator-password",
            "--Logging:LogLevel:Default=Warning",
        ]);
        try
        {
            await app.StartAsync();
            var loaded = app.Services.GetRequiredService<GridCatalog>().Find(grid.Name)
                ?? throw new InvalidOperationException($"the generated grid {grid.Name} did not load");
            output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"grid: {grid.Segments.Length:#,0} segments, {grid.Switches.Length:#,0} switches, {grid.Indicators.Length:#,0} indicators; app started and grid loaded in {clock.Elapsed.TotalMilliseconds:0} ms"));
            app.Services.GetRequiredService<AccountDirectory>().CreateWithPassword("bench", "Bench operator", AccountRole.Operator, Password, null, Setup);
            var board = app.Services.GetRequiredService<IncidentBoard>();
            var address = app.Urls.First();

            using var playwright = await Playwright.CreateAsync();
            await using var browser = await playwright.Chromium.LaunchAsync(new BrowserTypeLaunchOptions
            {
                ExecutablePath = Chromium,
                Headless = true,
                Args = ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
            });
            var page = await browser.NewPageAsync(new BrowserNewPageOptions { ViewportSize = new ViewportSize { Width = 1920, Height = 1080 } });
            await page.AddInitScriptAsync(InPageWatch.Replace("PLANNED", $"'{Planned}'", StringComparison.Ordinal));
            page.SetDefaultTimeout(120_000);
            await page.GotoAsync($"{address}/sign-in?returnUrl=%2F");
            await page.FillAsync("[data-testid=sign-in-name]", "bench");
            await page.FillAsync("[data-testid=sign-in-password]", Password);
            await page.ClickAsync("[data-testid=sign-in]");
            await page.WaitForURLAsync(url => !url.Contains("/sign-in", StringComparison.Ordinal));

            var simulator = new IncidentSimulator(loaded.Graph, new SimulationSettings());
            var random = new Random(seed);
            var breakers = grid.Switches.Where(s => s.Kind == Core.Model.SwitchKind.Breaker).Select(s => s.Id.Value).ToList();
            var buttonFeedback = new List<double>();
            var buttonOpen = new List<double>();
            var addressOpen = new List<double>();
            var buttonPlan = new List<double>();
            var addressOutside = new List<double>();
            var addressLive = new List<double>();
            var addressPlan = new List<double>();
            var zoom = new List<double>();
            var pan = new List<double>();
            var settled = new List<double>();
            var elements = new List<int>();
            for (var n = 0; n <= rounds; n++)
            {
                // The board's button: a new incident on a breaker, no evidence yet.
                await page.GotoAsync($"{address}/");
                await page.Locator("[data-testid=interactive]").WaitForAsync();
                await page.SelectOptionAsync("[data-testid=new-tripped]", breakers[n % breakers.Count]);
                await page.SelectOptionAsync("[data-testid=new-type]", "LG");
                await page.Locator("[data-testid=open-incident]").WaitForAsync();
                clock.Restart();
                var inPage = await page.EvaluateAsync<double[]>("""
                    async () => {
                      const t0 = performance.now();
                      const shown = window.__flUntil(() => document.querySelector('.desk, [data-testid=opening]'));
                      const opened = window.__flUntil(window.__flReady);
                      const planned = window.__flUntil(window.__flPlanned);
                      document.querySelector('[data-testid=open-incident]').click();
                      return [await shown - t0, await opened - t0, await planned - t0];
                    }
                    """);
                var feedback = inPage[0];
                var opened = inPage[1];
                var planned = inPage[2];
                await ViewReady(page);

                // By its address, with simulated evidence: a page load, the circuit, the ranking and the first view.
                var incident = simulator.Next(random, n).Incident;
                var id = board.Open(loaded, incident, Setup);
                clock.Restart();
                await page.GotoAsync($"{address}/incidents/{id.Value}", new PageGotoOptions { WaitUntil = WaitUntilState.Commit });
                await page.Locator("[data-testid=interactive]").WaitForAsync();
                await ViewReady(page);
                var openedByAddressOutside = clock.Elapsed.TotalMilliseconds;
                await page.Locator(Planned).First.WaitForAsync();
                var byAddress = await page.EvaluateAsync<double[]>("async () => [await window.__flOpened, await window.__flPlannedOnLoad, await window.__flOpenedLive]");
                var (openedByAddress, plannedByAddress, liveByAddress) = (byAddress[0], byAddress[1], byAddress[2]);
                await Settled(page);

                var steps = new List<(string Kind, double Ms, double SettledMs, int Elements)>();
                foreach (var (button, times) in new[] { ("Zoom out", 6), ("Zoom in", 6) })
                {
                    for (var k = 0; k < times; k++)
                    {
                        var (ms, settle) = await Step(page, $"document.querySelector(\"[aria-label='{button}']\").click()");
                        steps.Add(("zoom", ms, settle, await Elements(page)));
                    }
                }

                for (var k = 0; k < 6; k++)
                {
                    var (ms, settle) = await Step(page, Drag(k % 2 == 0 ? 160 : -120, k % 3 == 0 ? 90 : -60));
                    steps.Add(("pan", ms, settle, await Elements(page)));
                }

                if (n > 0)
                {
                    buttonFeedback.Add(feedback);
                    buttonOpen.Add(opened);
                    buttonPlan.Add(planned);
                    addressOutside.Add(openedByAddressOutside);
                    addressLive.Add(liveByAddress);
                    addressOpen.Add(openedByAddress);
                    addressPlan.Add(plannedByAddress);
                    zoom.AddRange(steps.Where(s => s.Kind == "zoom").Select(s => s.Ms));
                    pan.AddRange(steps.Where(s => s.Kind == "pan").Select(s => s.Ms));
                    settled.AddRange(steps.Select(s => s.SettledMs));
                    elements.AddRange(steps.Select(s => s.Elements));
                }

                output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"round {n}{(n == 0 ? " (warm-up)" : string.Empty)}: open by button {opened:0} ms (page shown {feedback:0} ms, switching order {planned:0} ms), by address {openedByAddress:0} ms (live {liveByAddress:0} ms, switching order {plannedByAddress:0} ms, seen by the driver {openedByAddressOutside:0} ms); zoom {string.Join(" ", steps.Where(s => s.Kind == "zoom").Select(s => s.Ms.ToString("0", CultureInfo.InvariantCulture)))} ms; pan {string.Join(" ", steps.Where(s => s.Kind == "pan").Select(s => s.Ms.ToString("0", CultureInfo.InvariantCulture)))} ms"));
            }

            string Ms(List<double> values)
            {
                var sorted = values.Order().ToList();
                return string.Create(CultureInfo.InvariantCulture, $"median {sorted[sorted.Count / 2]:0} ms, slowest {sorted[^1]:0} ms ({sorted.Count} measured)");
            }

            output.WriteLine($"open an incident with the board's button, to the page shown: {Ms(buttonFeedback)}");
            output.WriteLine($"open an incident with the board's button, to the ranked suspects and the labelled view: {Ms(buttonOpen)}");
            output.WriteLine($"the same, to the switching order: {Ms(buttonPlan)}");
            output.WriteLine($"open an incident with evidence by its address (page load), to the ranked suspects and the labelled view: {Ms(addressOpen)}");
            output.WriteLine($"the same, to the ranked suspects and the labelled view with the page live (its circuit up, clicks answered): {Ms(addressLive)}");
            output.WriteLine($"the same, to the switching order: {Ms(addressPlan)}");
            output.WriteLine($"the same as seen by the test driver (it polls; slower on a busy machine): {Ms(addressOutside)}");
            output.WriteLine($"zoom step (button), click to the next frame with the new view: {Ms(zoom)}");
            output.WriteLine($"pan step (drag), pointer move to the next frame with the new view: {Ms(pan)}");
            output.WriteLine($"after a step, to the server's drawing of the new view on screen: {Ms(settled)}");
            output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"SVG elements in the view after a step: median {elements.Order().ElementAt(elements.Count / 2):#,0}, most {elements.Max():#,0}"));
            return 0;
        }
        finally
        {
            await app.StopAsync();
            await app.DisposeAsync();
            Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
            Directory.Delete(folder, recursive: true);
        }
    }

    /// <summary>
    /// Run in every page before its own scripts: <c>__flUntil(check)</c> resolves with performance.now() at the
    /// next frame after <c>check()</c> holds (watching the document's changes); <c>__flOpened</c> and
    /// <c>__flPlannedOnLoad</c> from the page's navigation start (performance.timeOrigin) to the ranked suspects
    /// with the labelled view, and to the switching order; <c>__flOpenedLive</c> to the ranked suspects and the
    /// labelled view on a live page (a prerendered page shows them before its circuit answers clicks).
    /// </summary>
    /// <summary>The switching order shown: its next step, or why there is none.</summary>
    private const string Planned = "[data-testid=plan-steps] [data-testid=next-step], [data-testid=plan-steps] p.warning[role=alert]";

    private const string InPageWatch = """
        (() => {
          window.__flReady = () => !!document.querySelector('[data-testid=ranked-list] ol.sections li') && !!document.querySelector('[data-testid=oneline] text.label');
          window.__flPlanned = () => !!document.querySelector(PLANNED);
          window.__flUntil = check => new Promise(resolve => {
            const done = () => requestAnimationFrame(() => setTimeout(() => resolve(performance.now()), 0));
            if (check()) { done(); return; }
            const watch = new MutationObserver(() => { if (check()) { watch.disconnect(); done(); } });
            watch.observe(document, { childList: true, subtree: true });
          });
          window.__flOpened = window.__flUntil(window.__flReady);
          window.__flOpenedLive = window.__flUntil(() => window.__flReady() && !!document.querySelector('[data-testid=interactive]'));
          window.__flPlannedOnLoad = window.__flUntil(window.__flPlanned);
        })();
        """;

    /// <summary>The ranked suspects listed and the one-line view drawn with its labels.</summary>
    private static async Task ViewReady(IPage page)
    {
        await page.Locator("[data-testid=ranked-list] ol.sections li").First.WaitForAsync();
        await page.Locator("[data-testid=oneline] text.label").First.WaitForAsync();
    }

    /// <summary>Until the server's drawing is the one on screen.</summary>
    private static Task Settled(IPage page) => page.WaitForFunctionAsync(SettledCheck + "; return settled();}");

    private const string SettledCheck = """
        () => { const settled = () => {
          const root = document.querySelector('[data-testid=oneline]');
          const svg = root?.querySelector(':scope > svg');
          return !!svg && root.dataset.drawn === svg.getAttribute('viewBox');
        }
        """;

    /// <summary>
    /// Runs <paramref name="action"/> in the page; gives the time to the first frame after the diagram's
    /// view changed, and the time until the server's drawing of that view is on screen.
    /// </summary>
    private static async Task<(double Ms, double SettledMs)> Step(IPage page, string action)
    {
        var result = await page.EvaluateAsync<double[]>(("async " + SettledCheck + $$"""
            ;
              const svg = document.querySelector('[data-testid=oneline] > svg');
              const before = svg.getAttribute('viewBox');
              const frame = () => new Promise(r => requestAnimationFrame(() => setTimeout(r, 0)));
              const changed = new Promise(resolve => {
                const watch = new MutationObserver(() => { if (svg.getAttribute('viewBox') !== before) { watch.disconnect(); resolve(); } });
                watch.observe(svg, { attributes: true, attributeFilter: ['viewBox'] });
              });
              const t0 = performance.now();
              {{action}};
              await changed;
              await frame();
              const shown = performance.now() - t0;
              while (!settled()) { await new Promise(r => setTimeout(r, 5)); }
              await frame();
              return [shown, performance.now() - t0];
            }
            """));
        return (result[0], result[1]);
    }

    /// <summary>A drag of the diagram by (dx, dy) px as pointer events: press in the middle, one move, release.</summary>
    private static string Drag(int dx, int dy) => $$"""
        (() => {
          const svg = document.querySelector('[data-testid=oneline] > svg');
          const r = svg.getBoundingClientRect();
          const x = r.left + r.width / 2, y = r.top + r.height / 2;
          const at = (type, px, py, buttons) => svg.dispatchEvent(new PointerEvent(type, { clientX: px, clientY: py, buttons, button: 0, pointerId: 1, isPrimary: true, bubbles: true }));
          at('pointerdown', x, y, 1);
          at('pointermove', x + {{dx}}, y + {{dy}}, 1);
          at('pointerup', x + {{dx}}, y + {{dy}}, 0);
        })()
        """;

    private static Task<int> Elements(IPage page) =>
        page.EvaluateAsync<int>("() => document.querySelectorAll('[data-testid=oneline] > svg *').length");
}
