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

namespace FeederLocate.Application.Tests.Analysis;

public sealed class IncidentAnalysisTests : IDisposable
{
    private readonly TestLog _test = new();
    private readonly CountingRanker _ranker = new();

    public void Dispose()
    {
        _ranker.Dispose();
        _test.Dispose();
    }

    public static TheoryData<string> Cases() => new()
    {
        "solid:solid-lg-trip-a1.incident.json",
        "impedance:impedance-lg-trip-a2.incident.json",
        "isolated:isolated-standing-earth-fault-a2.incident.json",
        "resonant:resonant-standing-earth-fault-b1.incident.json",
        "synthetic-solid:7",
        "synthetic-isolated:11",
    };

    /// <summary>A grid and an incident on it: a sample one, or one simulated on a generated grid of another shape.</summary>
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
    public async Task A_second_outcome_logged_on_an_incident_changes_the_next_ranking_of_another(string name)
    {
        var (graph, evidence) = Case(name);
        var grid = graph.Grid;
        var log = _test.Log;
        var learning = new GridLearning(log);
        var analysis = new IncidentAnalysis(learning, _ranker);
        // Two places the fault could be: the two segments the evidence alone ranks highest.
        var alone = FaultRanking.Rank(graph, evidence);
        var (first, second) = (alone.Segments[0].Id, alone.Segments[1].Id);
        var past = log.Open(grid, evidence, Samples.Operator);
        log.Record(past, new OutcomeLogged(first, evidence.FaultType, "first report"), Samples.Operator);
        var current = log.Open(grid, evidence, Samples.Operator);

        var before = await analysis.RankAsync(graph, log.State(current));
        log.Record(past, new OutcomeLogged(second, evidence.FaultType, "corrected by the crew"), Samples.Operator);
        var after = await analysis.RankAsync(graph, log.State(current));

        Assert.Equal(Probabilities(Expected(graph, evidence, first)), Probabilities(before.Result!));
        Assert.Equal(Probabilities(Expected(graph, evidence, second)), Probabilities(after.Result!));
        Assert.NotEqual(Probabilities(before.Result!), Probabilities(after.Result!));
        Assert.Equal(2, _ranker.Runs);
    }

    [Fact]
    public async Task Twenty_concurrent_ranking_requests_after_one_change_run_the_ranking_once()
    {
        var graph = Samples.Graph("solid");
        var log = _test.Log;
        var analysis = new IncidentAnalysis(new GridLearning(log), _ranker);
        var id = log.Open(graph.Grid, Samples.Incident("solid-lg-trip-a1.incident.json", graph.Grid), Samples.Operator);
        await analysis.RankAsync(graph, log.State(id));
        log.Record(id, new IndicationEntered(new Indication(new IndicatorId("FPI-A1-14"), IndicatorState.Fault, IndicationSource.Field, null)), Samples.Operator);

        _ranker.Hold();
        var requests = new Task<RankingOutcome>[20];
        Parallel.For(0, requests.Length, i => requests[i] = analysis.RankAsync(graph, log.State(id)));
        var allWaiting = requests.All(r => !r.IsCompleted);
        _ranker.Release();
        var results = await Task.WhenAll(requests);

        Assert.True(allWaiting, "every request was still waiting for the ranking while it ran");
        Assert.Equal(2, _ranker.Runs);
        Assert.All(results, r => Assert.Same(results[0], r));
        Assert.NotNull(results[0].Result);
    }

    [Fact]
    public async Task An_unchanged_incident_is_ranked_once_and_any_event_of_it_makes_a_new_ranking()
    {
        var graph = Samples.Graph("solid");
        var log = _test.Log;
        var analysis = new IncidentAnalysis(new GridLearning(log), _ranker);
        var id = log.Open(graph.Grid, Samples.Incident("solid-lg-trip-a1.incident.json", graph.Grid), Samples.Operator);

        var first = await analysis.RankAsync(graph, log.State(id));
        var again = await analysis.RankAsync(graph, log.State(id));
        log.Record(id, new MeasurementRecorded(new SubstationMeasurement(new SwitchId("CB-A1"), 1700, null, null)), Samples.Operator);
        var changed = await analysis.RankAsync(graph, log.State(id));

        Assert.Same(first, again);
        Assert.NotSame(first, changed);
        Assert.Equal(2, _ranker.Runs);
    }

    [Fact]
    public async Task The_plan_follows_the_ranking_of_the_same_state()
    {
        var graph = Samples.Graph("solid");
        var log = _test.Log;
        var analysis = new IncidentAnalysis(new GridLearning(log), _ranker);
        var id = log.Open(graph.Grid, Samples.Incident("solid-lg-trip-a1.incident.json", graph.Grid), Samples.Operator);

        var result = await analysis.AnalyseAsync(graph, log.State(id));

        Assert.NotNull(result.Plan.Plan);
        Assert.Equal(result.Ranking.Result!.Sections[0].Id, result.Plan.Plan!.IsolatedSections[0]);
        Assert.Equal(1, _ranker.Runs);
    }

    private static RankingResult Expected(NetworkGraph graph, Incident evidence, SegmentId confirmed) =>
        FaultRanking.Rank(graph, evidence, priors: LearnedRankingPriors.From(graph, [new ConfirmedIncident(evidence, confirmed)]));

    private static List<(string, double)> Probabilities(RankingResult result) =>
        [.. result.Segments.Select(s => (s.Id.Value, s.Probability))];
}
