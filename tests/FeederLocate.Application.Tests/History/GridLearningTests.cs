using FeederLocate.Application.History;
using FeederLocate.Application.Tests.Support;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Storage.Events;

namespace FeederLocate.Application.Tests.History;

public sealed class GridLearningTests : IDisposable
{
    private readonly TestLog _test = new();

    public void Dispose() => _test.Dispose();

    [Theory]
    [InlineData("solid", "solid-lg-trip-a1.incident.json")]
    [InlineData("impedance", "impedance-lg-trip-a2.incident.json")]
    [InlineData("isolated", "isolated-standing-earth-fault-a2.incident.json")]
    [InlineData("resonant", "resonant-standing-earth-fault-b1.incident.json")]
    public void Priors_are_learned_from_every_other_outcome_of_the_grid_and_leave_an_incidents_own_out(string scheme, string file)
    {
        var graph = Samples.Graph(scheme);
        var evidence = Samples.Incident(file, graph.Grid);
        var segments = FaultRanking.Rank(graph, evidence).Segments;
        var log = _test.Log;
        var a = log.Record(graph.Grid, evidence, new OutcomeLogged(segments[0].Id, evidence.FaultType), Samples.Operator);
        var b = log.Record(graph.Grid, evidence, new OutcomeLogged(segments[1].Id, evidence.FaultType), Samples.Operator);
        var learning = new GridLearning(log);

        var all = learning.Priors(graph);
        var withoutA = learning.Priors(graph, a);

        Assert.Equal(Rates(LearnedRankingPriors.From(graph, [new(evidence, segments[0].Id), new(evidence, segments[1].Id)])), Rates(all));
        Assert.Equal(Rates(LearnedRankingPriors.From(graph, [new(evidence, segments[1].Id)])), Rates(withoutA));
        Assert.Equal(2, learning.ConfirmedIncidents(graph).Count);
        Assert.NotEqual(a, b);
    }

    [Fact]
    public void What_was_learned_is_kept_until_an_outcome_of_the_grid_changes()
    {
        var graph = Samples.Graph("solid");
        var evidence = Samples.Incident("solid-lg-trip-a1.incident.json", graph.Grid);
        var log = _test.Log;
        var learning = new GridLearning(log);
        var past = log.Open(graph.Grid, evidence, Samples.Operator);
        log.Record(past, new OutcomeLogged(new SegmentId("S109"), evidence.FaultType), Samples.Operator);

        var first = learning.Learned(graph);
        var unchanged = learning.Learned(graph);
        log.Record(log.Open(graph.Grid, evidence, Samples.Operator), new IndicationEntered(evidence.Indications[0]), Samples.Operator);
        var afterOtherIncident = learning.Learned(graph);
        log.Record(past, new OutcomeLogged(new SegmentId("S108"), evidence.FaultType), Samples.Operator);
        var afterCorrection = learning.Learned(graph);

        Assert.Same(first, unchanged);
        Assert.Same(first, afterOtherIncident);
        Assert.NotSame(first, afterCorrection);
        Assert.Equal(1, afterCorrection.FaultRateOf(new SegmentId("S108")).Faults);
        Assert.Equal(0, afterCorrection.FaultRateOf(new SegmentId("S109")).Faults);
    }

    [Fact]
    public void An_outcome_on_a_segment_the_loaded_grid_no_longer_has_is_not_learned_from()
    {
        var graph = Samples.Graph("solid");
        var evidence = Samples.Incident("solid-lg-trip-a1.incident.json", graph.Grid);
        var log = _test.Log;
        var id = log.Open(graph.Grid, evidence, Samples.Operator);
        log.Record(id, new OutcomeLogged(new SegmentId("S-REMOVED"), evidence.FaultType), Samples.Operator);

        Assert.Empty(new GridLearning(log).ConfirmedIncidents(graph));
        Assert.Same(RankingPriors.None, new GridLearning(log).Priors(graph));
    }

    private static List<string> Rates(RankingPriors priors) =>
    [
        .. priors.SegmentFaultsPerKmYear.OrderBy(p => p.Key.Value, StringComparer.Ordinal).Select(p => $"{p.Key} {p.Value:R}"),
        .. priors.IndicatorRates.OrderBy(p => p.Key.Value, StringComparer.Ordinal).Select(p => $"{p.Key} {p.Value}"),
    ];
}
