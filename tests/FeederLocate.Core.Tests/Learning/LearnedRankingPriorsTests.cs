using System.Collections.Immutable;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Learning;

/// <summary>Learning from logged incidents through the engine: what each indication is compared with, and outcomes the grid cannot explain.</summary>
public class LearnedRankingPriorsTests
{
    [Theory]
    [InlineData("isolated")]
    [InlineData("resonant")]
    [InlineData("solid")]
    [InlineData("impedance")]
    public void A_noisy_indicators_false_report_rate_is_learned_near_its_truth_on_every_scheme(string scheme)
    {
        // Invented defect: a remote non-directional indicator reports `fault` 80 % of the time when it should not.
        var grid = Grids.Sample(scheme);
        var noisy = grid.Indicators.First(i => i.Remote && !i.Directional).Id;
        var (outcomes, _) = History(grid, noisy, 0.8, count: 150, seed: 4);

        var learned = LearnedRankingPriors.Learn(new NetworkGraph(grid), outcomes);

        var reliability = learned.ReliabilityOf(noisy);
        Assert.True(reliability.Counts.FalseReportTrials > 20, $"{reliability.Counts.FalseReportTrials} false-report trials");
        Assert.InRange(reliability.FalseReportProbability, 0.65, 0.95);
        Assert.Empty(learned.Skipped);
    }

    [Fact]
    public void On_an_isolated_network_the_expected_states_are_probabilities_over_the_fault_resistance()
    {
        // Without substation records nothing narrows the fault resistance: an indicator looking away from the source
        // with a fault upstream picks up its branch's charging current only at a low resistance, so its expected
        // state is `fault` with some probability and `none` with the rest.
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(60, Seed: 2, GroundingScheme.Isolated, IndicatorsPerSegment: 0.5, Substations: 1));
        var graph = new NetworkGraph(grid);
        var simulator = new IncidentSimulator(graph, new SimulationSettings(UnknownProbability: 0));
        var random = new Random(3);
        var mixed = 0;
        for (var n = 0; n < 40; n++)
        {
            var simulated = simulator.Next(random, n);
            var incident = simulated.Incident with { Measurements = [], FaultType = FaultType.LG, TrippedDevice = null };
            var expected = LearnedRankingPriors.ExpectedDistributionAtConfirmed(graph, incident, simulated.Segment);
            foreach (var states in expected.Values)
            {
                Assert.Equal(1, states.Values.Sum(), 9);
                mixed += states.Count > 1 ? 1 : 0;
            }
        }

        Assert.True(mixed > 0, "no indicator's expected state depended on the fault resistance");
    }

    [Fact]
    public void Outcomes_the_grid_cannot_explain_are_skipped_and_reported_and_the_rest_still_count()
    {
        var grid = Grids.Sample("resonant");
        var noisy = grid.Indicators[0].Id;
        var (outcomes, _) = History(grid, noisy, 0.02, count: 3, seed: 1);
        var tie = grid.Switches.First(s => s.NormallyOpen).Id;
        var loop = outcomes[1] with
        {
            Incident = outcomes[1].Incident with { SwitchStates = ImmutableDictionary<SwitchId, SwitchPosition>.Empty.Add(tie, SwitchPosition.Closed) },
        };
        var gone = outcomes[2] with { Segment = new SegmentId("S-REMOVED") };

        var learned = LearnedRankingPriors.Learn(new NetworkGraph(grid), [outcomes[0], loop, gone]);

        Assert.Equal(2, learned.Skipped.Length);
        Assert.Contains(learned.Skipped, s => s.Segment == new SegmentId("S-REMOVED") && s.Reason.Contains("S-REMOVED", StringComparison.Ordinal));
        Assert.Contains(learned.Skipped, s => s.Segment == loop.Segment && s.Reason.Contains("radial", StringComparison.Ordinal));
        Assert.Equal(1, learned.FaultRates.Faults);
    }

    /// <summary>A simulated history with one noisy indicator, as confirmed outcomes.</summary>
    private static (List<Outcome> Outcomes, List<SimulatedIncident> Simulated) History(Grid grid, IndicatorId noisy, double falseRate, int count, int seed)
    {
        var settings = new SimulationSettings(FalseProbabilityByIndicator: ImmutableDictionary<IndicatorId, double>.Empty.Add(noisy, falseRate));
        var simulator = new IncidentSimulator(new NetworkGraph(grid), settings);
        var random = new Random(seed);
        var simulated = Enumerable.Range(0, count).Select(n => simulator.Next(random, n)).ToList();
        return ([.. simulated.Select(s => new Outcome(s.Incident, s.Segment))], simulated);
    }
}
