using System.Collections.Immutable;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Ranking;

/// <summary>
/// The substation's neutral voltage U0 is one voltage at the bus: every feeder breaker's record repeats the
/// same reading, and one measurement is one piece of evidence (common practice). It is counted once per
/// bus, however many feeder records carry it.
/// </summary>
public class BusVoltageTests
{
    private static readonly Grid Grid = Grids.Sample("resonant");

    /// <summary>The feeder breakers at the first substation's bus.</summary>
    private static List<SwitchingDevice> FeederBreakers() =>
        [.. Grid.Switches.Where(d => d.Kind == SwitchKind.Breaker && (d.From == Grid.Substations[0].BusNode || d.To == Grid.Substations[0].BusNode))];

    private static Incident WithRecords(IEnumerable<SubstationMeasurement> records) =>
        new(DateTimeOffset.UnixEpoch, null, ImmutableDictionary<SwitchId, SwitchPosition>.Empty, null, FaultType.LG, [.. records], []);

    private static RankingComputation Computation(Incident incident) =>
        new(new NetworkGraph(Grid), incident, RankingOptions.Default, RankingPriors.None);

    /// <summary>An energised segment fed from the first substation and an earth fault at its midpoint.</summary>
    private static (int Segment, FaultSolution Fault) FaultAtFirstSubstation(RankingComputation computation)
    {
        var network = computation.Network;
        var segment = Enumerable.Range(0, Grid.Segments.Length)
            .First(s => network.IsSegmentEnergised(s) && network.SubstationIndexOf(network.SuppliedEndOf(s)) == 0);
        return (segment, computation.Model.Solve(segment, 0.5, FaultType.LG, 20));
    }

    [Fact]
    public void A_U0_repeated_by_every_feeder_record_weighs_as_one_reading()
    {
        var breakers = FeederBreakers();
        Assert.True(breakers.Count >= 2, "the sample's first substation has at least two feeder breakers");
        var probe = Computation(WithRecords([new SubstationMeasurement(breakers[0].Id, NeutralVoltageV: 1000)]));
        var (segment, fault) = FaultAtFirstSubstation(probe);
        var u0 = fault.NeutralVoltageMagnitudeV;

        // Every feeder record carries the predicted U0 exactly, and nothing else.
        var computation = Computation(WithRecords(breakers.Select(b => new SubstationMeasurement(b.Id, NeutralVoltageV: u0))));
        var log = computation.MeasurementLogLikelihoodDirect(segment, fault);

        // One normal density at its centre: σ = 5 % of U0 + 200 V (the option's tolerance), log = −ln σ − ½ ln 2π.
        var sigma = (0.05 * u0) + 200;
        var one = -Math.Log(sigma) - (0.5 * Math.Log(2 * Math.PI));
        Assert.Equal(one, log, 9);
        // The ranking's shortcut counts it once too (within its table's linear interpolation, about 1e-5 nat here).
        Assert.Equal(log, computation.MeasurementLogLikelihoodFast(segment, fault), 1e-4);
    }

    [Fact]
    public void Differing_U0_readings_of_one_bus_count_as_their_mean_once()
    {
        var breakers = FeederBreakers();
        var probe = Computation(WithRecords([new SubstationMeasurement(breakers[0].Id, NeutralVoltageV: 1000)]));
        var (segment, fault) = FaultAtFirstSubstation(probe);
        var u0 = fault.NeutralVoltageMagnitudeV;

        // Two readings 300 V either side of the prediction: their mean is the prediction itself.
        var split = Computation(WithRecords([
            new SubstationMeasurement(breakers[0].Id, NeutralVoltageV: u0 - 300),
            new SubstationMeasurement(breakers[1].Id, NeutralVoltageV: u0 + 300)]));
        var single = Computation(WithRecords([new SubstationMeasurement(breakers[1].Id, NeutralVoltageV: u0)]));

        Assert.Equal(single.MeasurementLogLikelihoodDirect(segment, fault), split.MeasurementLogLikelihoodDirect(segment, fault), 9);
        Assert.Single(split.Measured, m => m.Measurement.NeutralVoltageV is not null);
    }

    [Fact]
    public void The_currents_of_every_record_still_count()
    {
        var breakers = FeederBreakers();
        var probe = Computation(WithRecords([new SubstationMeasurement(breakers[0].Id, NeutralVoltageV: 1000)]));
        var (segment, fault) = FaultAtFirstSubstation(probe);
        var u0 = fault.NeutralVoltageMagnitudeV;
        var records = breakers.Select((b, k) => new SubstationMeasurement(b.Id, ResidualCurrentA: 2 + k, NeutralVoltageV: u0)).ToList();

        var all = Computation(WithRecords(records));
        var currentsOnly = Computation(WithRecords(records.Select(r => r with { NeutralVoltageV = null })));
        var voltageOnly = Computation(WithRecords([records[0] with { ResidualCurrentA = null }]));

        Assert.Equal(
            currentsOnly.MeasurementLogLikelihoodDirect(segment, fault) + voltageOnly.MeasurementLogLikelihoodDirect(segment, fault),
            all.MeasurementLogLikelihoodDirect(segment, fault),
            9);
    }
}
