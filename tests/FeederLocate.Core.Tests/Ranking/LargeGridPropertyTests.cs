using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;
using Xunit.Abstractions;

namespace FeederLocate.Core.Tests.Ranking;

/// <summary>
/// The ranking on generated grids of every grounding scheme and of 200 to 5,000 segments, against
/// noiseless evidence: every indication exactly as the reference model expects and every feeder-breaker
/// record exact, for a random fault (segment, position, type, and a fault resistance over the range the
/// ranking considers for that type and scheme). Such evidence is consistent, and the true section ranks
/// in the top three — counting as one with it every section that the evidence cannot tell from it:
/// those holding a segment where a fault of the same type, resistance and position gives exactly the
/// same indications and lies where the tripped device sees it (exhaustive search over all segments).
/// Without that allowance no method could pass: where indicators are sparse, several sections share one
/// zone between indicators and only their prior fault rates order them.
/// </summary>
public class LargeGridPropertyTests(ITestOutputHelper output)
{
    [Theory]
    [InlineData(GroundingScheme.Isolated, 200, 1)]
    [InlineData(GroundingScheme.Resonant, 200, 2)]
    [InlineData(GroundingScheme.Solid, 200, 3)]
    [InlineData(GroundingScheme.Impedance, 200, 4)]
    [InlineData(GroundingScheme.Isolated, 1000, 5)]
    [InlineData(GroundingScheme.Resonant, 1000, 6)]
    [InlineData(GroundingScheme.Solid, 1000, 7)]
    [InlineData(GroundingScheme.Impedance, 1000, 8)]
    [InlineData(GroundingScheme.Isolated, 5000, 9)]
    [InlineData(GroundingScheme.Resonant, 5000, 10)]
    [InlineData(GroundingScheme.Solid, 5000, 11)]
    [InlineData(GroundingScheme.Impedance, 5000, 12)]
    public void Noiseless_evidence_ranks_the_true_section_in_the_top_three_and_is_consistent(GroundingScheme scheme, int segments, int seed)
    {
        var random = new Random(seed);
        // Shapes vary with the seed: feeder length, switch spacing, indicator density, one to three substations.
        var options = new SyntheticGridOptions(segments, seed, scheme, 0.1 + (0.2 * random.NextDouble()), 20 + random.Next(60), 2 + random.Next(5), 1 + random.Next(3));
        var grid = SyntheticGrid.Generate(options);
        var graph = new NetworkGraph(grid);
        var network = graph.Energise(SwitchStates.Normal(grid));
        var simulator = new IncidentSimulator(graph, new SimulationSettings(0, 0, 0, 0));
        var energised = Enumerable.Range(0, grid.Segments.Length).Where(network.IsSegmentEnergised).ToList();
        var faults = segments >= 5000 ? 3 : 5;
        var failures = new List<string>();
        for (var n = 0; n < faults; n++)
        {
            var segment = energised[random.Next(energised.Count)];
            var position = random.NextDouble();
            var lowCurrent = grid.Substations[network.SubstationIndexOf(network.SuppliedEndOf(segment))].Grounding.Scheme is GroundingScheme.Isolated or GroundingScheme.Resonant;
            var (type, rf) = DrawFault(random, lowCurrent);
            var incident = simulator.At(grid.Segments[segment].Id, position, type, rf, random).Incident;

            var ranking = FaultRanking.Rank(graph, incident);

            var computation = new RankingComputation(graph, incident, RankingOptions.Default, RankingPriors.None);
            var alike = Indistinguishable(computation, incident, segment, position, type, rf);
            var trueSection = graph.Sections.OfSegment(segment).Id;
            var rank = ranking.Sections.Select(s => s.Id).ToList().IndexOf(trueSection);
            var distinctAbove = ranking.Sections.Take(rank).Count(s => !alike.Contains(s.Id));
            var what = $"{grid.Segments[segment].Id} at {position:F2}, {type}, Rf {rf:F1} Ω: section #{rank + 1} of {ranking.Sections.Length} ({alike.Count} alike), {distinctAbove} distinct above, consistent {ranking.Consistent}";
            output.WriteLine(what);
            if (distinctAbove > 2 || !ranking.Consistent)
            {
                failures.Add(what);
            }
        }

        Assert.True(failures.Count == 0, string.Join(Environment.NewLine, failures));
    }

    /// <summary>A fault type and resistance over the range the ranking considers for the scheme (RankingOptions defaults).</summary>
    private static (FaultType Type, double FaultResistanceOhm) DrawFault(Random random, bool lowCurrent)
    {
        var u = random.NextDouble();
        var type = lowCurrent ? (u < 0.7 ? FaultType.LG : u < 0.8 ? FaultType.LL : u < 0.9 ? FaultType.LLG : FaultType.LLL)
            : u < 0.5 ? FaultType.LG : u < 0.7 ? FaultType.LL : u < 0.85 ? FaultType.LLG : FaultType.LLL;
        var rf = type switch
        {
            FaultType.LG or FaultType.LLG when lowCurrent => random.NextDouble() < 0.2 ? 0 : Math.Exp(random.NextDouble() * Math.Log(5000)),
            // Earthed networks: a tripping earth fault up to 20 Ω, or a high-resistance one of 0.2 to 5 kΩ.
            FaultType.LG when random.NextDouble() < 0.3 => 200 * Math.Pow(25, random.NextDouble()),
            FaultType.LG or FaultType.LLG => random.NextDouble() * 20,
            _ => random.NextDouble() * 3,
        };
        return (type, rf);
    }

    /// <summary>
    /// Exhaustive search: the sections holding a segment where the same fault gives every indicator the
    /// state it reported, and that the tripped device (if any) would have seen.
    /// </summary>
    private static HashSet<SectionId> Indistinguishable(RankingComputation computation, Incident incident, int trueSegment, double position, FaultType type, double rf)
    {
        var model = computation.Model;
        var grid = model.Grid;
        var reported = grid.Indicators.Select(i => incident.IndicationOf(i.Id)?.State ?? IndicatorState.Unknown).ToArray();
        var sections = new HashSet<SectionId> { computation.Graph.Sections.OfSegment(trueSegment).Id };
        for (var s = 0; s < grid.Segments.Length; s++)
        {
            if (!computation.Network.IsSegmentEnergised(s) || computation.TripLogFactor(s) != 0)
            {
                continue;
            }

            var fault = model.Solve(s, position, type, rf);
            var same = true;
            for (var i = 0; i < grid.Indicators.Length && same; i++)
            {
                same = reported[i] == IndicatorState.Unknown || model.Read(fault, i).Expected == reported[i];
            }

            if (same)
            {
                sections.Add(computation.Graph.Sections.OfSegment(s).Id);
            }
        }

        return sections;
    }
}
