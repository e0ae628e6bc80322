using System.CommandLine;

namespace FeederLocate.LoadTest;

/// <summary>
/// <c>feederlocate-loadtest</c>. Exit codes: 0 no errors and nothing lost, 1 otherwise, 2 bad options.
/// A named entry point: the web app already has a top-level <c>Program</c>, and the tests see both.
/// </summary>
internal static class LoadTestProgram
{
    public static async Task<int> Main(string[] args)
    {
        var clients = new Option<int>("--clients") { Description = "Concurrent clients", DefaultValueFactory = _ => LoadOptions.DefaultClients };
        var seconds = new Option<int>("--seconds") { Description = "How long the clients keep sending", DefaultValueFactory = _ => LoadOptions.DefaultSeconds };
        var incidents = new Option<int>("--incidents") { Description = "Incidents opened across the grids (client k works on incident k mod this)", DefaultValueFactory = _ => LoadOptions.DefaultIncidents };
        var gridFolder = new Option<string>("--grid-folder") { Description = "Folder of *.grid.json files", DefaultValueFactory = _ => RepositoryFolder.SampleGrids() };
        var seed = new Option<int>("--seed") { Description = "Seed of the clients' choice of indicators and states", DefaultValueFactory = _ => 1 };
        var report = new Option<string?>("--report") { Description = "Also write the report as JSON to this file" };
        var root = new RootCommand(
            "Bounded loopback load test of the FeederLocate HTTP API: concurrent clients post indications and read rankings, " +
            "then the incident log is checked for every accepted indication. Exit 0 only with no errors and nothing lost.")
        {
            clients, seconds, incidents, gridFolder, seed, report,
        };

        root.SetAction(async (parse, cancellation) =>
        {
            var options = new LoadOptions(parse.GetValue(clients), TimeSpan.FromSeconds(parse.GetValue(seconds)), parse.GetValue(incidents),
                parse.GetValue(gridFolder)!, parse.GetValue(seed), parse.GetValue(report));
            if (options.Problems() is { Count: > 0 } problems)
            {
                foreach (var problem in problems)
                {
                    await Console.Error.WriteLineAsync($"error: {problem}");
                }

                return 2;
            }

            var result = await LoadRun.RunAsync(options, Console.Error, cancellation);
            result.WriteText(Console.Out);
            if (options.ReportPath is { } path)
            {
                await File.WriteAllTextAsync(path, result.ToJson(), cancellation);
            }

            return result.Passed ? 0 : 1;
        });

        var segments = new Option<int>("--segments") { Description = "Segments of the generated grid", DefaultValueFactory = _ => 10_000 };
        var rounds = new Option<int>("--rounds") { Description = "Simulated incidents opened (after one warm-up)", DefaultValueFactory = _ => 10 };
        var viewSeed = new Option<int>("--seed") { Description = "Seed of the grid and the incidents", DefaultValueFactory = _ => 1 };
        var view = new Command("view", "Measures the server's share of the one-line view on a generated grid: loading it, opening an incident, pan and zoom steps")
        {
            segments, rounds, viewSeed,
        };
        view.SetAction(parse => ViewBench.Run(parse.GetValue(segments), parse.GetValue(viewSeed), parse.GetValue(rounds), Console.Out));
        root.Subcommands.Add(view);

        var browserSegments = new Option<int>("--segments") { Description = "Segments of the generated grid", DefaultValueFactory = _ => 10_000 };
        var browserRounds = new Option<int>("--rounds") { Description = "Rounds of opening, zooming and panning (after one warm-up)", DefaultValueFactory = _ => 5 };
        var browserSeed = new Option<int>("--seed") { Description = "Seed of the grid and the incidents", DefaultValueFactory = _ => 1 };
        var browser = new Command("browser", "Measures the one-line view in headless Chromium on a generated grid: opening an incident, zoom and pan steps")
        {
            browserSegments, browserRounds, browserSeed,
        };
        browser.SetAction((parse, _) => BrowserBench.RunAsync(parse.GetValue(browserSegments), parse.GetValue(browserSeed), parse.GetValue(browserRounds), Console.Out));
        root.Subcommands.Add(browser);

        return await root.Parse(args).InvokeAsync();
    }
}
