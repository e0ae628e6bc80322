using FeederLocate.Application.Analysis;
using FeederLocate.Application.History;
using FeederLocate.Application.Tests.Support;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Events;

namespace FeederLocate.Application.Tests.History;

/// <summary>
/// An outcome logged on evidence no radial network explains (as the log held before such evidence was refused)
/// is skipped and named by the learning; every ranking of the grid goes on, and learns from the other outcomes.
/// </summary>
public sealed class UnusableOutcomeTests : IDisposable
{
    private readonly TestLog _test = new();

    public void Dispose() => _test.Dispose();

    public static TheoryData<string> Cases() => new()
    {
        "solid:solid-lg-trip-a1.incident.json",
        "impedance:impedance-lg-trip-a2.incident.json",
        "isolated:isolated-standing-earth-fault-a2.incident.json",
        "resonant:resonant-standing-earth-fault-b1.incident.json",
        "synthetic-solid:7",
        "synthetic-resonant:13",
    };

    private static (NetworkGraph Graph, Incident Incident) Case(string name)
    {
        var (kind, detail) = (name.Split(':')[0], name.Split(':')[1]);
        if (!kind.StartsWith("synthetic-", StringComparison.Ordinal))
        {
            var graph = Samples.Graph(kind);
            return (graph, Samples.Incident(detail, graph.Grid));
        }

        var scheme = Enum.Parse<GroundingScheme>(kind["synthetic-".Length..], ignoreCase: true);
        var seed = int.Parse(detail, System.Globalization.CultureInfo.InvariantCulture);
        var generated = new NetworkGraph(SyntheticGrid.Generate(new SyntheticGridOptions(120, seed, scheme, IndicatorsPerSegment: 0.3, SegmentsPerFeeder: 30)));
        return (generated, new IncidentSimulator(generated, new SimulationSettings()).Next(new Random(seed), 1).Incident);
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public async Task An_outcome_on_switch_states_with_a_loop_is_skipped_and_named_and_every_ranking_goes_on(string name)
    {
        var (graph, evidence) = Case(name);
        var grid = graph.Grid;
        var ties = grid.Switches.Where(s => s.NormallyOpen).ToList();
        Assert.NotEmpty(ties);
        var segments = FaultRanking.Rank(graph, evidence).Segments;
        var log = _test.Log; // no grid lookup: the log as written before loops were refused
        var good = log.Append(grid, evidence, new OutcomeLogged(segments[0].Id, evidence.FaultType), Samples.Operator);
        var bad = log.Open(grid, evidence, Samples.Operator);
        log.AppendAll(bad, [.. ties.Select(t => (IncidentEvent)new SwitchStateChanged(t.Id, SwitchPosition.Closed))], Samples.Operator);
        log.Append(bad, new OutcomeLogged(segments[1].Id, evidence.FaultType), Samples.Operator);
        var current = log.Open(grid, evidence, Samples.Operator);
        Assert.False(graph.TryEnergise(SwitchStates.AtFaultTime(grid, log.State(bad).Incident), out _, out _));
        var learning = new GridLearning(log);
        var analysis = new IncidentAnalysis(learning, new CoreFaultRanker());

        var unusable = learning.Unusable(graph);
        var ranking = await analysis.RankAsync(graph, log.State(current));
        var history = await new IncidentHistory(log, learning, analysis).ForAsync(graph);

        var skipped = Assert.Single(unusable);
        Assert.Equal(bad, skipped.Incident);
        Assert.Equal(segments[1].Id, skipped.ConfirmedSegment);
        Assert.Contains("radial", skipped.Problem, StringComparison.Ordinal);
        Assert.NotNull(ranking.Result);
        Assert.Null(ranking.Problem);
        Assert.Equal([segments[0].Id], learning.OutcomesForLearning(graph).Select(c => c.Segment).ToList());
        Assert.Equal(segments[0].Id, log.State(good).Outcome!.Outcome.ConfirmedSegment);
        // The priors are those the usable outcome alone teaches.
        Assert.Equal(Rates(LearnedRankingPriors.From(graph, [new(evidence, segments[0].Id)])), Rates(learning.Priors(graph)));
        Assert.Equal([bad], history.Unusable.Select(u => u.Incident).ToList());
        Assert.Null(history.Incidents.Single(i => i.Summary.Id == bad).RankOfConfirmedSection);
    }

    [Fact]
    public void An_outcome_whose_evidence_names_a_device_the_grid_no_longer_has_is_skipped_and_named()
    {
        var graph = Samples.Graph("solid");
        var evidence = Samples.Incident("solid-lg-trip-a1.incident.json", graph.Grid);
        var log = _test.Log;
        var id = log.Open(graph.Grid, evidence, Samples.Operator);
        log.Append(id, new SwitchStateChanged(new SwitchId("LBS-REMOVED"), SwitchPosition.Open), Samples.Operator);
        log.Append(id, new OutcomeLogged(new SegmentId("S109"), evidence.FaultType), Samples.Operator);
        var learning = new GridLearning(log);

        var skipped = Assert.Single(learning.Unusable(graph));

        Assert.Contains("LBS-REMOVED", skipped.Problem, StringComparison.Ordinal);
        Assert.Same(RankingPriors.None, learning.Priors(graph));
        Assert.Empty(learning.OutcomesForLearning(graph));
    }

    private static List<string> Rates(RankingPriors priors) =>
    [
        .. priors.SegmentFaultsPerKmYear.OrderBy(p => p.Key.Value, StringComparer.Ordinal).Select(p => $"{p.Key} {p.Value:R}"),
        .. priors.IndicatorRates.OrderBy(p => p.Key.Value, StringComparer.Ordinal).Select(p => $"{p.Key} {p.Value}"),
    ];
}
