using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Ranking;

/// <summary>
/// The first pass passes over segments whose likelihood bound shows they cannot matter
/// (<see cref="RankingComputation.ScoreSegments"/>). The bound must hold on every segment, and the pruned
/// ranking must equal the one that scores every segment: checked on generated grids of every grounding
/// scheme, 200 to 1,500 segments, one to three substations, with simulated incidents with and without the
/// protection context and high-resistance earth faults (fixed seeds).
/// </summary>
public class BranchAndBoundTests
{
    /// <summary>
    /// Posterior tolerance per section: the segments passed over hold together at most e^-30 ≈ 1e-13 of the best's
    /// posterior, and the rest is the same arithmetic; 1e-9 leaves room for the normalisation's rounding.
    /// </summary>
    private const double PosteriorTolerance = 1e-9;

    public static TheoryData<GroundingScheme, int, int> Grids() => new()
    {
        { GroundingScheme.Isolated, 200, 1 },
        { GroundingScheme.Resonant, 400, 2 },
        { GroundingScheme.Solid, 800, 3 },
        { GroundingScheme.Impedance, 1500, 4 },
        { GroundingScheme.Isolated, 1500, 5 },
        { GroundingScheme.Resonant, 800, 6 },
        { GroundingScheme.Solid, 400, 7 },
        { GroundingScheme.Impedance, 200, 8 },
    };

    private static (NetworkGraph Graph, List<Evidence.Incident> Incidents) Generated(GroundingScheme scheme, int segments, int seed)
    {
        var random = new Random(seed);
        var options = new SyntheticGridOptions(segments, seed, scheme, 0.1 + (0.2 * random.NextDouble()), 20 + random.Next(60), 2 + random.Next(5), 1 + random.Next(3));
        var graph = new NetworkGraph(SyntheticGrid.Generate(options));
        var plain = new IncidentSimulator(graph, new SimulationSettings());
        var protection = new IncidentSimulator(graph, new SimulationSettings() with { ProtectionContext = true, HighResistanceShare = 1.0 / 3 });
        return (graph, [.. Enumerable.Range(0, 6).Select(n => (n % 2 == 0 ? plain : protection).Next(random, n).Incident)]);
    }

    [Theory]
    [MemberData(nameof(Grids))]
    public void The_bound_lies_above_every_segments_likelihood(GroundingScheme scheme, int segments, int seed)
    {
        var (graph, incidents) = Generated(scheme, segments, seed);
        foreach (var incident in incidents)
        {
            var computation = new RankingComputation(graph, incident, RankingOptions.Default, RankingPriors.None) { Exhaustive = true };
            foreach (var score in computation.ScoreSegments())
            {
                var bound = computation.UpperBound(score.Segment);
                // The marginal and the best hypothesis are both at most the largest likelihood of any hypothesis.
                Assert.True(score.LogMarginal <= bound + 1e-9, $"segment {score.Segment}: marginal {score.LogMarginal} above bound {bound}");
                Assert.True(score.Best.LogLikelihood <= bound + 1e-9, $"segment {score.Segment}: best {score.Best.LogLikelihood} above bound {bound}");
            }
        }
    }

    [Theory]
    [MemberData(nameof(Grids))]
    public void The_pruned_ranking_equals_the_one_that_scores_every_segment(GroundingScheme scheme, int segments, int seed)
    {
        var (graph, incidents) = Generated(scheme, segments, seed);
        var passedOver = 0;
        foreach (var incident in incidents)
        {
            var full = FaultRanking.Rank(graph, incident, RankingOptions.Default, RankingPriors.None, exhaustive: true);
            var pruned = FaultRanking.Rank(graph, incident, RankingOptions.Default, RankingPriors.None, exhaustive: false);

            var fullSections = full.Sections.ToDictionary(s => s.Id, s => s.Probability);
            Assert.Equal(fullSections.Count, pruned.Sections.Length);
            Assert.All(pruned.Sections, s => Assert.Equal(fullSections[s.Id], s.Probability, PosteriorTolerance));
            Assert.Equal(full.Sections[0].Id, pruned.Sections[0].Id);
            Assert.Equal(full.Consistent, pruned.Consistent);
            Assert.Equal(full.CrossCountry.Select(p => (p.First, p.Second)), pruned.CrossCountry.Select(p => (p.First, p.Second)));
            Assert.Equal(full.SwitchSuspects.Select(s => s.Device), pruned.SwitchSuspects.Select(s => s.Device));
            Assert.Equal(full.Explanations.Select(e => e.Segment), pruned.Explanations.Select(e => e.Segment));
            Assert.All(full.FaultTypeProbabilities, t => Assert.Equal(t.Value, pruned.FaultTypeProbabilities[t.Key], PosteriorTolerance));

            var computation = new RankingComputation(graph, incident, RankingOptions.Default, RankingPriors.None);
            computation.ScoreSegments();
            passedOver += computation.PassedOver;
        }

        // Not vacuous: the bound does pass over segments on these grids.
        Assert.True(passedOver > 0, "no segment was passed over");
    }
}
