using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;
using static FeederLocate.Core.Evidence.IndicatorState;

namespace FeederLocate.Core.Tests.Evaluation;

public class RankingEvaluationTests
{
    [Fact]
    public void Ranking_beats_the_baseline_and_stays_near_its_limit_on_simulated_incidents()
    {
        var grid = Grids.Sample("isolated");

        // A fake clock stands still: the evaluation's timing reads zero and nothing depends on the wall clock.
        var report = RankingEvaluation.Run(grid, 60, seed: 7, new SimulationSettings(), TestClock.Manual());

        Assert.Equal(60, report.Incidents);
        foreach (var rates in new[] { report.Deployed, report.Limit, report.Baseline })
        {
            foreach (var rate in new[] { rates.SectionTop1, rates.SectionTop3, rates.SegmentTop1, rates.SegmentTop3 })
            {
                Assert.InRange(rate, 0, 1);
            }

            Assert.True(rates.SectionTop3 >= rates.SectionTop1);
            Assert.True(rates.SegmentTop3 >= rates.SegmentTop1);
            Assert.True(rates.SectionTop1 >= rates.SegmentTop1, "a segment hit is a hit of its section");
        }

        Assert.True(report.Deployed.SectionTop1 >= report.Baseline.SectionTop1,
            $"deployed section top-1 {report.Deployed.SectionTop1:P1} below the baseline's {report.Baseline.SectionTop1:P1}");
        Assert.True(report.Limit.SectionTop1 >= report.Deployed.SectionTop1 - 0.05,
            $"told the true rates {report.Limit.SectionTop1:P1}, deployed {report.Deployed.SectionTop1:P1}");
        Assert.Equal(0, report.MillisecondsPerIncident);
    }

    [Fact]
    public void Simulator_without_errors_reports_every_indicator_as_the_engine_expects()
    {
        foreach (var scheme in new[] { "isolated", "resonant", "solid", "impedance" })
        {
            var grid = Grids.Sample(scheme);
            var network = Grids.Normal(grid);
            var simulator = new IncidentSimulator(network.Graph, new SimulationSettings(0, 0, 0));
            var random = new Random(3);
            for (var n = 0; n < 15; n++)
            {
                var simulated = simulator.Next(random, n);
                var expected = FaultCurrents.At(network, new FaultCase(simulated.Segment, simulated.Position, simulated.Type, simulated.FaultResistanceOhm));

                Assert.Equal(grid.Indicators.Length, simulated.Incident.Indications.Length);
                Assert.All(expected.Indicators, r => Assert.Equal(r.Expected, simulated.Incident.IndicationOf(r.Id)!.State));

                // A standing earth fault (isolated or resonant, LG) trips nothing; every other fault trips the
                // protective device nearest it on its path.
                var standing = scheme is "isolated" or "resonant" && simulated.Type == FaultType.LG;
                Assert.Equal(standing ? (SwitchId?)null : EngineIncidents.TrippingDevice(network, simulated.Segment), simulated.Incident.TrippedDevice);
            }
        }
    }

    [Fact]
    public void Simulator_with_every_report_lost_gives_no_indications()
    {
        var grid = Grids.Sample("solid");
        var simulator = new IncidentSimulator(new NetworkGraph(grid), new SimulationSettings(UnknownProbability: 1));
        var random = new Random(5);

        for (var n = 0; n < 10; n++)
        {
            Assert.Empty(simulator.Next(random, n).Incident.Indications);
        }
    }

    [Fact]
    public void Simulator_with_the_same_seed_makes_the_same_incidents()
    {
        var grid = Grids.Sample("resonant");
        List<SimulatedIncident> Run(int seed)
        {
            var simulator = new IncidentSimulator(new NetworkGraph(grid), new SimulationSettings(0.1, 0.1, 0.2));
            var random = new Random(seed);
            return [.. Enumerable.Range(0, 20).Select(n => simulator.Next(random, n))];
        }

        var first = Run(42);
        var second = Run(42);
        var other = Run(43);

        Assert.Equal(first.Select(Describe), second.Select(Describe));
        Assert.NotEqual(first.Select(Describe), other.Select(Describe));
    }

    [Fact]
    public void Baseline_suspects_the_segment_of_the_deepest_indicator_that_saw_the_fault_then_what_lies_beyond()
    {
        // FPI-A1-11 on S108 is the deepest of the indicators that saw it; beyond S108's far end A1-12 lie
        // S109, and through LB-A1-4, FU-A1-6 and DS-A1-5 the segments S110, S111, S114, S115, S112, S113, S116.
        var grid = Grids.Sample("solid");
        var baseline = new BaselineLocator(Grids.Normal(grid));
        var incident = EngineIncidents.WithIndications(new SwitchId("CB-A1"), FaultType.LG,
            ("FPI-A1-01", Forward), ("FPI-A1-04", Fault), ("FPI-A1-11", Forward), ("FPI-A1-14", None));

        var suspects = baseline.Suspects(incident, 30).Select(s => s.Value).ToList();

        Assert.Equal("S108", suspects[0]);
        Assert.Equal(["S109", "S110", "S111", "S112", "S113", "S114", "S115", "S116"], suspects.Skip(1).Order());
        Assert.Equal(3, baseline.Suspects(incident, 3).Count);
    }

    [Fact]
    public void Baseline_ignores_an_indicator_marked_suspect()
    {
        var grid = Grids.Sample("solid");
        var baseline = new BaselineLocator(Grids.Normal(grid));
        var incident = EngineIncidents.WithIndications(new SwitchId("CB-A1"), FaultType.LG,
            ("FPI-A1-01", Forward), ("FPI-A1-04", Fault), ("FPI-A1-11", Forward))
            .With("FPI-A1-11", i => i with { Suspect = true });

        Assert.Equal("S103", baseline.Suspects(incident, 1)[0].Value);
    }

    [Fact]
    public void Baseline_without_indications_starts_beyond_the_tripped_device_or_the_largest_residual()
    {
        var grid = Grids.Sample("isolated");
        var baseline = new BaselineLocator(Grids.Normal(grid));
        var tripped = EngineIncidents.WithIndications(new SwitchId("RC-B1-1"), FaultType.LL);
        var standing = EngineIncidents.WithIndications(null, FaultType.LG) with
        {
            Measurements =
            [
                new SubstationMeasurement(new SwitchId("CB-A1"), ResidualCurrentA: 9.5),
                new SubstationMeasurement(new SwitchId("CB-A2"), ResidualCurrentA: 21.0),
            ],
        };

        // RC-B1-1 joins B1-03 to B1-04; S303 leaves B1-04. CB-A2 recorded the larger residual; S201 leaves A2-01.
        Assert.Equal("S303", baseline.Suspects(tripped, 1)[0].Value);
        Assert.Equal("S201", baseline.Suspects(standing, 1)[0].Value);
    }

    private static string Describe(SimulatedIncident s)
    {
        var i = s.Incident;
        return $"{s.Segment} {s.Position:R} {s.Type} {s.FaultResistanceOhm:R} {i.ReportedAt:O} {i.TrippedDevice} {i.FaultType} | "
            + string.Join(";", i.Measurements.Select(m => $"{m.Device}:{m.PhaseCurrentA:R}/{m.ResidualCurrentA:R}/{m.NeutralVoltageV:R}")) + " | "
            + string.Join(";", i.Indications.Select(x => $"{x.Indicator}:{x.State}:{x.Source}"));
    }
}
