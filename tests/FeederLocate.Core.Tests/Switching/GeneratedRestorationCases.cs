using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

/// <summary>
/// Trips on generated grids of several shapes, each planned and compared with the exhaustive search
/// over the switches that touch the dead area. Invented grids (src/FeederLocate.Core/Synthetic); every
/// grounding scheme in turn; a three-phase fault trips its feeder breaker on all of them.
/// </summary>
public static class GeneratedRestorationCases
{
    /// <summary>Cases whose exhaustive search would try more switches than this are not enumerated (2^14 load flows).</summary>
    public const int MaxEnumeratedSwitches = 14;

    private const int SeedsPerShape = 4;
    private const int SectionsPerGrid = 6;

    /// <summary>The shapes the issue names: many laterals, several ties per feeder, ties between substations, disconnectors and fuses in the path, heavy load.</summary>
    public static IReadOnlyDictionary<string, Func<int, SyntheticGridOptions>> Shapes { get; } = new Dictionary<string, Func<int, SyntheticGridOptions>>
    {
        ["many laterals"] = seed => Base(seed, 36) with { LateralShare = 0.75 },
        ["several ties per feeder"] = seed => Base(seed, 30, substations: 1) with { ExtraTiesPerFeeder = 2 },
        ["ties between substations"] = seed => Base(seed, 40, substations: 3) with { ExtraTiesPerFeeder = 1, ExtraTiesBetweenSubstations = true },
        ["disconnectors and fuses in the path"] = seed => Base(seed, 36) with { DisconnectorShare = 0.35, FuseShare = 0.3, ExtraTiesPerFeeder = 1 },
        ["heavy load"] = seed => Base(seed, 36) with { LoadScale = 2.2, ExtraTiesPerFeeder = 1 },
    };

    private static readonly Lazy<IReadOnlyList<CaseResult>> All = new(() => [.. Shapes.Keys.SelectMany(Run)]);

    public static IReadOnlyList<CaseResult> Results => All.Value;

    public static IEnumerable<CaseResult> Of(string shape) => Results.Where(r => r.Shape == shape);

    private static SyntheticGridOptions Base(int seed, int segments, int substations = 2) =>
        new(segments, seed, (GroundingScheme)(seed % 4), 0.2, SegmentsPerFeeder: 10, SegmentsPerSwitch: 2, Substations: substations);

    private static IEnumerable<CaseResult> Run(string shape)
    {
        for (var seed = 1; seed <= SeedsPerShape; seed++)
        {
            var grid = SyntheticGrid.Generate(Shapes[shape](seed));
            var graph = new NetworkGraph(grid);
            if (!ExhaustiveRestoration.WithinLimits(grid, graph.Energise(SwitchStates.Normal(grid)), [.. grid.Nodes.Select(_ => 1.0)], SwitchingOptions.Default.VoltageLimitPu))
            {
                // The normal state already breaks a limit: no switching of the dead area can make the whole network keep them.
                yield return new CaseResult(shape, seed, grid.Name, null, -1, -1, [], true);
                continue;
            }

            var random = new Random(seed);
            var normal = graph.Energise(SwitchStates.Normal(grid));
            var picks = graph.Sections.All
                .Select(s => (Section: s, Breaker: FeederBreaker(grid, normal, s)))
                .Where(p => p.Breaker is not null)
                .Select(p => (p.Section, Breaker: p.Breaker!.Value))
                .OrderBy(_ => random.Next())
                .Take(SectionsPerGrid)
                .ToList();
            foreach (var (section, breaker) in picks)
            {
                var incident = new Incident(new DateTimeOffset(2026, 3, 1, 8, 0, 0, TimeSpan.Zero), null,
                    ImmutableDictionary<SwitchId, SwitchPosition>.Empty, breaker, FaultType.LLL, [], []);
                var plan = SwitchingPlanner.Plan(graph, incident, section.Id);
                var checker = new PlanChecker(grid);
                var problems = checker.Check(incident, plan, section.Segments[0], standing: false).Problems;
                problems.AddRange(checker.CheckReturn(incident, plan, SwitchingPlanner.PlanReturn(graph, incident, plan)));
                var domain = ExhaustiveRestoration.Domain(grid, incident);
                if (domain > MaxEnumeratedSwitches)
                {
                    yield return new CaseResult(shape, seed, grid.Name, section.Id, plan.RestoredCustomers, -1, problems, false);
                    continue;
                }

                var (best, _) = ExhaustiveRestoration.Best(grid, incident, section.Id, plan.ColdLoadFactor, plan.VoltageLimitPu, MaxEnumeratedSwitches);
                yield return new CaseResult(shape, seed, grid.Name, section.Id, plan.RestoredCustomers, best, problems, false);
            }
        }
    }

    /// <summary>The breaker at the head of the feeder that supplies the section in the normal state.</summary>
    private static SwitchId? FeederBreaker(Grid grid, EnergisedNetwork normal, Section section)
    {
        var node = grid.NodeIndex(section.Nodes[0]);
        if (!normal.IsEnergised(node))
        {
            return null;
        }

        var path = normal.PathFromSource(section.Nodes[0]);
        var first = path.FirstOrDefault(e => e.Kind == EdgeKind.Switch);
        return first.Kind == EdgeKind.Switch && grid.Switches[first.Index].Kind == SwitchKind.Breaker ? grid.Switches[first.Index].Id : null;
    }

    /// <param name="Exhaustive">The exhaustive best, or -1 where the case was too large to enumerate.</param>
    /// <param name="NormalBreaksLimits">The generated grid breaks a limit in its normal state; nothing was planned.</param>
    public sealed record CaseResult(string Shape, int Seed, string Grid, SectionId? Section, int Planned, int Exhaustive, IReadOnlyList<string> Problems, bool NormalBreaksLimits)
    {
        public bool Enumerated => Exhaustive >= 0;

        public override string ToString() => $"{Shape}, seed {Seed}, section {Section}: plan {Planned}, exhaustive {Exhaustive}";
    }
}
