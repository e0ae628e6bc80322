using System.Numerics;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Tests.Support;
using static FeederLocate.Core.Evidence.IndicatorState;

namespace FeederLocate.Core.Tests.Ranking;

/// <summary>
/// Two earth faults on different phases on two feeders of substation A of the isolated sample grid. The
/// indications and records are built by hand with the approximation the ranking states for it: the
/// current of a phase-to-phase loop closed through earth between the two fault points, phase current on
/// the path to each point, residual current beyond the point where the paths part (here the bus, so on
/// both paths). CB-A1 cleared it.
/// </summary>
public class CrossCountryTests
{
    /// <summary>IEC 60909-0 cmax for MV, as the engine and the sample-grid README use.</summary>
    private const double VoltageFactor = 1.1;

    /// <summary>The records here are derived at c = 1.1 (VoltageFactor): the ranking is told the same c.</summary>
    private static readonly RankingOptions AtDerivedVoltage = RankingOptions.Default with { VoltageFactor = VoltageFactor };

    /// <summary>Source impedance at A-BUS from the sample-grid README (IEC 60909-0 with KT).</summary>
    private static readonly Complex SourceOhm = new(0.0591, 1.4499);

    /// <summary>The paths from A-BUS, segment and km of it, to the middle of S105, S206 and S207 (sample-grid topology).</summary>
    internal static readonly (string LineType, double Km)[] ToMiddleOfS105 = [("CAB-AL240", 1.4), ("CAB-AL240", 1.1), ("CAB-AL150", 1.2), ("CAB-AL95", 0.45)];

    internal static readonly (string LineType, double Km)[] ToMiddleOfS206 = [("CAB-AL240", 1.6), ("CAB-AL240", 1.3), ("CAB-AL150", 1.4), ("CAB-AL95", 0.4)];

    private static readonly (string LineType, double Km)[] ToMiddleOfS207 = [.. ToMiddleOfS206[..3], ("CAB-AL95", 0.8 + 0.3)];

    [Fact]
    public void Faults_on_two_feeders_of_one_bus_rank_the_pair_first()
    {
        // Every pair with one fault in SEC-S105 {S105, S106, S107} (nothing measures beyond FPI-A1-07) and one
        // in SEC-S206 {S206, S207, S208} (nothing beyond FPI-A2-08) explains the indications. The records
        // single out the pair: any other pair's middle points lie at least 0.65 km of Al 95 further out, about
        // 0.4 Ω more loop impedance against some 5.8 Ω, so some 6 % less current, over 1σ on each of the four
        // records. It also has the largest prior of the nine (0.9 km × 0.8 km).
        var grid = Grids.Sample("isolated");
        var incident = CrossCountryIncident(grid, LoopCurrentA(grid, ToMiddleOfS105, ToMiddleOfS206));

        var ranking = FaultRanking.Rank(grid, incident, AtDerivedVoltage);

        Assert.NotEmpty(ranking.CrossCountry);
        var top = ranking.CrossCountry[0];
        Assert.Equal(["S105", "S206"], new[] { top.First.Value, top.Second.Value }.Order());
        Assert.Equal(["SEC-S105", "SEC-S206"], new[] { top.FirstSection.Value, top.SecondSection.Value }.Order());
        // Only the pair explains the evidence: no single fault does, so the evidence is not called consistent.
        Assert.False(ranking.Consistent);
        Assert.InRange(ranking.CrossCountryProbability, ranking.CrossCountry.Sum(p => p.Probability) - 1e-9, 1);
        Assert.Equal(["SEC-S105", "SEC-S206"], ranking.Sections.Take(2).Select(s => s.Id.Value).Order());
        var inTrueSections = ranking.CrossCountry.Where(p => InSections(p)).Sum(p => p.Probability);
        Assert.True(inTrueSections > 0.9, $"pairs in SEC-S105 × SEC-S206: {inTrueSections:F3}");
    }

    [Fact]
    public void Faults_deeper_in_the_same_sections_rank_pairs_of_those_sections_first()
    {
        // S105 and S207: the records cannot single the pair out. (S106, S206) has nearly the same loop (its
        // path is 0.8 km longer on A1 and 0.7 km shorter on A2) and a slightly larger prior (0.7 × 0.8 against
        // 0.9 × 0.6 km²), so the two share the top; no indicator lies beyond FPI-A1-07 or FPI-A2-08 to tell them apart.
        var grid = Grids.Sample("isolated");
        var incident = CrossCountryIncident(grid, LoopCurrentA(grid, ToMiddleOfS105, ToMiddleOfS207));

        var ranking = FaultRanking.Rank(grid, incident, AtDerivedVoltage);

        Assert.NotEmpty(ranking.CrossCountry);
        Assert.True(InSections(ranking.CrossCountry[0]), $"top pair {ranking.CrossCountry[0]}");
        var truePair = ranking.CrossCountry.Single(p => new[] { p.First.Value, p.Second.Value }.Order().SequenceEqual(["S105", "S207"]));
        Assert.True(truePair.Probability >= 0.5 * ranking.CrossCountry[0].Probability, $"true pair {truePair.Probability:F3}, top {ranking.CrossCountry[0].Probability:F3}");
        Assert.Equal(["SEC-S105", "SEC-S206"], ranking.Sections.Take(2).Select(s => s.Id.Value).Order());
    }

    /// <summary>
    /// Phase current on both paths (FPI-A1-01, FPI-A1-04 on the way to S105, FPI-A1-07 at its entrance;
    /// FPI-A2-01, FPI-A2-05, FPI-A2-08 toward A2's fault), and the same current as residual there, far above
    /// every pickup; every other indicator silent. Both feeder breakers record it as phase and residual current.
    /// </summary>
    internal static Incident CrossCountryIncident(Grid grid, double loopCurrentA)
    {
        var seen = new[] { ("FPI-A1-01", Forward), ("FPI-A1-04", Fault), ("FPI-A1-07", Fault), ("FPI-A2-01", Fault), ("FPI-A2-05", Forward), ("FPI-A2-08", Fault) };
        var silent = grid.Indicators.Select(i => i.Id.Value).Except(seen.Select(s => s.Item1)).Select(id => (id, None));
        Assert.All(grid.Indicators.Where(i => seen.Any(s => s.Item1 == i.Id.Value)),
            i => Assert.True(loopCurrentA > Math.Max(i.PhasePickupA ?? 0, i.EarthPickupA ?? 0)));
        return EngineIncidents.WithIndications(new SwitchId("CB-A1"), null, [.. seen, .. silent]) with
        {
            Measurements =
            [
                new SubstationMeasurement(new SwitchId("CB-A1"), loopCurrentA, loopCurrentA),
                new SubstationMeasurement(new SwitchId("CB-A2"), loopCurrentA, loopCurrentA),
            ],
        };
    }

    /// <summary>
    /// √3·E / |2·ZQ + Σ over both paths of (2·Z1 + Z0)/3|: the two phases from the source to the bus where the
    /// paths part, then each phase and earth out to its fault point, bolted (the loop approximation of
    /// CrossCountryRanking, written out with the line data of the grid's catalogue).
    /// </summary>
    internal static double LoopCurrentA(Grid grid, params (string LineType, double Km)[][] paths)
    {
        var phaseVoltageV = VoltageFactor * 20_000 / Math.Sqrt(3);
        var loop = 2 * SourceOhm;
        foreach (var (lineType, km) in paths.SelectMany(p => p))
        {
            var t = grid.LineType(new LineTypeId(lineType));
            loop += ((2 * new Complex(t.R1OhmPerKm, t.X1OhmPerKm)) + new Complex(t.R0OhmPerKm, t.X0OhmPerKm)) / 3 * km;
        }

        return Math.Sqrt(3) * phaseVoltageV / loop.Magnitude;
    }

    private static bool InSections(CrossCountrySuspect pair)
    {
        string[] a1 = ["S105", "S106", "S107"];
        string[] a2 = ["S206", "S207", "S208"];
        var ids = new[] { pair.First.Value, pair.Second.Value };
        return ids.Count(a1.Contains) == 1 && ids.Count(a2.Contains) == 1;
    }
}
