using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Tests.Support;

namespace FeederLocate.Core.Tests.Ranking;

/// <summary>Recorded currents are compared with the prediction at c = 1.0, not the rating factor cmax = 1.1 (IEC 60909-0 Table 1).</summary>
public class VoltageFactorTests
{
    [Fact]
    public void A_recorded_current_at_nominal_voltage_fits_its_prediction_exactly()
    {
        // A bolted three-phase fault at the middle of S109 on the solid sample: CB-A1 records the engine's
        // current at c = 1.0. The best explanation at S109 (Rf 0 Ω at the middle, one of the compared positions)
        // predicts that very current; with predictions at c = 1.1 every position would be some 10 % off.
        var grid = Grids.Sample("solid");
        var network = Grids.Normal(grid);
        var nominal = FaultCurrents.At(network, new FaultCase(new SegmentId("S109"), 0.5, FaultType.LLL, 0, 1.0));
        var rated = FaultCurrents.At(network, new FaultCase(new SegmentId("S109"), 0.5, FaultType.LLL, 0, 1.1));
        Assert.Equal(1.1, rated.FaultCurrentA / nominal.FaultCurrentA, 0.02);
        var incident = EngineIncidents.Exact(nominal, new SwitchId("CB-A1"), EngineIncidents.FeederRecords(grid, nominal, phase: true, earth: false));

        var ranking = FaultRanking.Rank(grid, incident);

        var record = ranking.Explanations.Single(e => e.Segment.Value == "S109").Measurements.Single(m => m.Device.Value == "CB-A1");
        Assert.Equal(nominal.FaultCurrentA, record.PredictedValue, 0.005 * nominal.FaultCurrentA);
        Assert.InRange(Math.Abs(record.DeviationSigma), 0, 0.1);
        Assert.Contains(FaultRanking.Rank(grid, EngineIncidents.WithIndications(new SwitchId("CB-A1"), FaultType.LLL)).Assumptions,
            a => a.StartsWith("predictions at voltage factor c = 1 ", StringComparison.Ordinal));
    }
}
