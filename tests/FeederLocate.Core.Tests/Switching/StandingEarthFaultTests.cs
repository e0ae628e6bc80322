using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;
using Xunit.Abstractions;

namespace FeederLocate.Core.Tests.Switching;

/// <summary>
/// Standing earth faults on isolated and resonant networks: the search comes first when the ranking is split,
/// its order keeps the expected customer interruptions low, and no tie closes onto a section still suspect.
/// On the samples and on generated grids of other shapes.
/// </summary>
public class StandingEarthFaultTests(ITestOutputHelper output)
{
    public static TheoryData<string> Networks() => ["sample isolated", "sample resonant", "generated isolated", "generated resonant"];

    private static Grid GridOf(string name) => name switch
    {
        "sample isolated" => Grids.Sample("isolated"),
        "sample resonant" => Grids.Sample("resonant"),
        "generated isolated" => SyntheticGrid.Generate(new SyntheticGridOptions(120, 11, GroundingScheme.Isolated, 0.2, SegmentsPerFeeder: 15, SegmentsPerSwitch: 2, Substations: 2) with { ExtraTiesPerFeeder = 1, LateralShare = 0.5 }),
        _ => SyntheticGrid.Generate(new SyntheticGridOptions(150, 23, GroundingScheme.Resonant, 0.2, SegmentsPerFeeder: 12, SegmentsPerSwitch: 2, Substations: 3) with { ExtraTiesPerFeeder = 2, ExtraTiesBetweenSubstations = true }),
    };

    /// <summary>Simulated standing earth faults (nothing tripped) with their rankings.</summary>
    private static IEnumerable<(Evidence.Incident Incident, SegmentId Segment, RankingResult Ranking)> Standing(NetworkGraph graph, int seed, int count)
    {
        var simulator = new IncidentSimulator(graph, new SimulationSettings());
        var random = new Random(seed);
        var found = 0;
        for (var n = 0; n < 200 && found < count; n++)
        {
            var simulated = simulator.Next(random, n);
            if (simulated.Incident.TrippedDevice is not null)
            {
                continue;
            }

            found++;
            yield return (simulated.Incident, simulated.Segment, FaultRanking.Rank(graph, simulated.Incident));
        }
    }

    [Theory]
    [MemberData(nameof(Networks))]
    public void No_tie_closes_onto_a_section_still_suspect_and_a_split_ranking_is_searched_first(string network)
    {
        var grid = GridOf(network);
        var graph = new NetworkGraph(grid);
        var checker = new PlanChecker(grid);
        var plans = 0;
        var searchedFirst = 0;
        foreach (var (incident, segment, ranking) in Standing(graph, 31, 12))
        {
            var plan = SwitchingPlanner.Plan(graph, incident, ranking);
            plans++;

            // The suspects, counted here: the fewest top sections holding 95 % of the probability (SwitchingOptions.SplitMassShare).
            var suspects = new HashSet<SectionId>();
            var mass = 0.0;
            foreach (var s in ranking.Sections.TakeWhile(s => s.Probability > 0))
            {
                if (mass >= 0.95)
                {
                    break;
                }

                suspects.Add(s.Id);
                mass += s.Probability;
            }

            suspects.ExceptWith(plan.IsolatedSections);
            var states = SwitchStates.AfterTrip(grid, incident);
            var live = graph.Energise(states);
            foreach (var step in plan.Steps.Where(s => s.ChangesNetwork))
            {
                states = states.With(step.Device!.Value, step.Action == StepAction.Open ? Evidence.SwitchPosition.Open : Evidence.SwitchPosition.Closed);
                var after = graph.Energise(states);
                if (step.Action == StepAction.Close && grid.Switch(step.Device!.Value).NormallyOpen)
                {
                    var onto = suspects.Where(id => !live.IsSegmentEnergised(graph.Sections[id].Segments[0]) && after.IsSegmentEnergised(graph.Sections[id].Segments[0])).ToList();
                    Assert.True(onto.Count == 0, $"{network}: tie {step.Device} closes onto suspect {string.Join(", ", onto)}");
                }

                live = after;
            }

            var split = ranking.Sections[0].Probability < 0.8;
            if (split && !plan.TestOrder.IsEmpty)
            {
                searchedFirst++;
                Assert.True(plan.SearchFirst, $"{network}: split ranking ({ranking.Sections[0].Probability:P0}) not searched first");
                Assert.Equal(StepAction.Verify, plan.Steps[0].Action);
                Assert.Contains("search first", plan.Steps[0].Reason, StringComparison.Ordinal);
                Assert.NotNull(plan.ExpectedCustomerInterruptions);
            }
            else
            {
                Assert.False(plan.SearchFirst);
            }

            Assert.Empty(checker.Check(incident, plan, segment, standing: true).Problems);
            Assert.Empty(checker.CheckTestOrder(incident, plan, segment, standing: true).Problems);
        }

        output.WriteLine($"{network}: {plans} standing earth faults, {searchedFirst} searched first");
        Assert.True(plans > 0, "no standing earth fault simulated");
    }

    [Fact]
    public void The_search_order_interrupts_fewer_customers_on_average_than_halving_the_probability()
    {
        double fewest = 0, halving = 0;
        var searches = 0;
        foreach (var network in new[] { "sample isolated", "sample resonant", "generated isolated", "generated resonant" })
        {
            var grid = GridOf(network);
            var graph = new NetworkGraph(grid);
            foreach (var (incident, segment, ranking) in Standing(graph, 57, 10))
            {
                var a = SwitchingPlanner.Plan(graph, incident, ranking);
                var b = SwitchingPlanner.Plan(graph, incident, ranking, SwitchingOptions.Default with { EarthFaultSearchOrder = EarthFaultSearchOrder.Bisection });
                if (a.ExpectedCustomerInterruptions is not { } ea || b.ExpectedCustomerInterruptions is not { } eb)
                {
                    continue;
                }

                // Either order must still end at the true section.
                var truth = graph.Sections.OfSegment(grid.SegmentIndex(segment)).Id;
                if (ranking.Sections.First(s => s.Id == truth).Probability > 0)
                {
                    Assert.Contains(truth, new PlanChecker(grid).CheckTestOrder(incident, a, segment, standing: true).FaultIn);
                }

                searches++;
                fewest += ea;
                halving += eb;
            }
        }

        output.WriteLine($"{searches} searches: expected customer interruptions {fewest:F0} (fewest first) against {halving:F0} (halving)");
        Assert.True(searches >= 5, $"only {searches} searches: the comparison says little");
        Assert.True(fewest <= halving, $"expected customer interruptions {fewest:F0} above halving's {halving:F0}");
    }
}
