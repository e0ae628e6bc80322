using System.Diagnostics;
using System.Globalization;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Synthetic;
using FeederLocate.Web.OneLine;
using FeederLocate.Web.Services;

namespace FeederLocate.LoadTest;

/// <summary>
/// <c>feederlocate-loadtest view</c>: the server's share of the one-line view on a generated grid, single-threaded,
/// as the page does it: loading the grid (graph, sections, names, the drawing's layout and labels), opening an
/// incident (ranking, switching order, the first view zoomed to the suspects) and each pan and zoom step
/// (what is in view and its labels). A benchmark: it reports, it asserts nothing. The browser's drawing and the
/// connection come on top; the README gives those as measured in the browser.
/// </summary>
internal static class ViewBench
{
    private const double WidthPx = 1100, HeightPx = 930;

    public static int Run(int segments, int seed, int rounds, TextWriter output)
    {
        var clock = Stopwatch.StartNew();
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed));
        var generated = clock.Elapsed.TotalMilliseconds;

        clock.Restart();
        var loaded = LoadedGrid.Of("bench", grid);
        _ = loaded.SectionNames;
        var load = clock.Elapsed.TotalMilliseconds;

        var simulator = new IncidentSimulator(loaded.Graph, new SimulationSettings());
        var random = new Random(seed);
        var opens = new List<double>();
        var rankings = new List<double>();
        var firstViews = new List<double>();
        var steps = new List<double>();
        var zoomSteps = new List<double>();
        var elements = new List<int>();
        for (var n = 0; n <= rounds; n++)
        {
            var incident = simulator.Next(random, n).Incident;
            clock.Restart();
            var ranking = FaultRanking.Rank(loaded.Graph, incident);
            var rankedOnly = clock.Elapsed.TotalMilliseconds;
            SwitchingPlanner.TryPlan(loaded.Graph, incident, ranking, out _, out _);
            var probability = ranking.Sections.ToDictionary(s => s.Id, s => s.Probability);
            var ranked = clock.Elapsed.TotalMilliseconds;

            clock.Restart();
            var focus = ranking.Sections.Take(3).Select(s => s.Id).ToHashSet();
            var box = loaded.Drawing.Segments.Where(s => focus.Contains(s.Section)).Select(s => s.Box).Aggregate((a, b) => a.Union(b));
            var view = OneLineViewport.Fit(loaded.Drawing, box, WidthPx, HeightPx);
            bool Always(SegmentId id) => probability.GetValueOrDefault(loaded.SectionOfSegment[id]) >= 0.005;
            var first = OneLineComposition.Of(loaded.Drawing, view, probability, Always);
            var firstView = clock.Elapsed.TotalMilliseconds;

            // Out to the whole network and back in, with a pan between: the buttons' steps and a drag of 200 px.
            var moves = new List<Func<OneLineViewport, OneLineViewport>>();
            moves.AddRange(Enumerable.Repeat<Func<OneLineViewport, OneLineViewport>>(v => v.Zoom(1 / OneLineViewport.Step, loaded.Drawing), 8));
            moves.Add(v => v.PanBy(200, 120));
            moves.AddRange(Enumerable.Repeat<Func<OneLineViewport, OneLineViewport>>(v => v.Zoom(OneLineViewport.Step, loaded.Drawing), 8));
            moves.AddRange(Enumerable.Repeat<Func<OneLineViewport, OneLineViewport>>(v => v.PanBy(-200, 0), 4));
            foreach (var (move, k) in moves.Select((m, k) => (m, k)))
            {
                clock.Restart();
                view = move(view);
                var composed = OneLineComposition.Of(loaded.Drawing, view, probability, Always);
                var ms = clock.Elapsed.TotalMilliseconds;
                if (n > 0)
                {
                    (k is < 8 or (> 8 and < 17) ? zoomSteps : steps).Add(ms);
                    elements.Add(composed.Scene.Segments.Count + composed.Scene.Switches.Count + composed.Scene.Indicators.Count + composed.Scene.Labels.Count + composed.Scene.Feeders.Count);
                }
            }

            if (n > 0)
            {
                opens.Add(ranked);
                rankings.Add(rankedOnly);
                firstViews.Add(firstView);
            }
        }

        string Ms(IEnumerable<double> values)
        {
            var sorted = values.Order().ToList();
            return string.Create(CultureInfo.InvariantCulture, $"median {sorted[sorted.Count / 2]:0.0} ms, slowest {sorted[^1]:0.0} ms");
        }

        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"grid: {grid.Segments.Length:#,0} segments, {grid.Switches.Length:#,0} switches, {grid.Indicators.Length:#,0} indicators; drawing {loaded.Drawing.Width:#,0} × {loaded.Drawing.Height:#,0} units, {loaded.Drawing.Labels.Length:#,0} labels (generated in {generated:0} ms)"));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"load the grid (graph, sections, names, layout, labels): {load:0} ms, once per grid"));
        output.WriteLine($"open an incident, ranking alone ({rounds} simulated incidents): {Ms(rankings)}");
        output.WriteLine($"open an incident, ranking and switching order ({rounds} simulated incidents): {Ms(opens)}");
        output.WriteLine($"open an incident, first view on the suspects: {Ms(firstViews)}");
        output.WriteLine($"zoom step (button): {Ms(zoomSteps)}");
        output.WriteLine($"pan step: {Ms(steps)}");
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"elements drawn per view: median {elements.Order().ElementAt(elements.Count / 2):#,0}, most {elements.Max():#,0}"));
        return 0;
    }
}
