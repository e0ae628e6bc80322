using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Tests.Support;

namespace FeederLocate.Core.Tests.Electrical;

/// <summary>
/// Worked example of the reference model (shared/examples/README.md, "Tiny Fen 20 kV"): these values
/// pin down how the model is read; they are not an outside source. Tolerance 0.5 % as the example states.
/// </summary>
public class TinyFenWorkedExampleTests
{
    private const double RelativeTolerance = 0.005;

    public static TheoryData<string, string, double, double, FaultType, double, double, double[], double[], string[]> Rows => new()
    {
        // scheme, segment, position, Rf, type, faultCurrentA, neutralVoltageV, healthy V, residual A at FI1..FI3, expected
        { "isolated", "S2", 0.5, 0, FaultType.LG, 21.46, 12790, [22040, 22077], [0.0, 21.09, 12.05], ["none", "forward", "fault"] },
        { "resonant", "S2", 0.5, 0, FaultType.LG, 1.242, 12696, [21996, 21996], [22.36, 1.556, 11.97], ["fault", "none", "fault"] },
        { "solid", "S2", 0.5, 0, FaultType.LG, 2373, 1509, [15359, 15124], [2375, 2373, 1.42], ["fault", "forward", "none"] },
        { "impedance", "S2", 0.5, 0, FaultType.LG, 837.3, 10112, [19105, 21379], [838.0, 837.3, 9.53], ["fault", "forward", "fault"] },
        { "isolated", "S3", 0.5, 500, FaultType.LG, 16.33, 9735, [14583, 22108], [0.0, 0.275, 7.157], ["none", "none", "none"] },
    };

    [Theory]
    [MemberData(nameof(Rows))]
    public void Earth_fault_matches_the_worked_example(
        string scheme, string segment, double position, double rfOhm, FaultType type,
        double faultCurrentA, double neutralVoltageV, double[] healthyV, double[] residualA, string[] expected)
    {
        var grid = Grids.TinyFen(scheme);
        var result = FaultCurrents.At(grid, new FaultCase(new SegmentId(segment), position, type, rfOhm));

        AssertClose(faultCurrentA, result.FaultCurrentA, "fault current");
        AssertClose(neutralVoltageV, result.NeutralVoltageV, "neutral voltage");
        Assert.Equal(2, result.HealthyPhaseVoltagesV.Length);
        AssertClose(healthyV[0], result.HealthyPhaseVoltagesV[0], "Ub");
        AssertClose(healthyV[1], result.HealthyPhaseVoltagesV[1], "Uc");
        for (var i = 0; i < 3; i++)
        {
            var response = result.Indicators[i];
            // Residual currents near zero are compared absolutely (0.05 A): 0.5 % of zero is no tolerance.
            if (residualA[i] < 1)
            {
                Assert.InRange(response.ResidualCurrentA, residualA[i] - 0.05, residualA[i] + 0.05);
            }
            else
            {
                AssertClose(residualA[i], response.ResidualCurrentA, $"residual at {response.Id}");
            }

            Assert.Equal(expected[i], FeederLocate.Core.Formats.IncidentFormat.Name(response.Expected));
        }
    }

    [Fact]
    public void Three_phase_fault_at_the_end_of_the_overhead_line_matches_the_worked_example()
    {
        var grid = Grids.TinyFen("solid");
        var result = FaultCurrents.At(grid, new FaultCase(new SegmentId("S2"), 1.0, FaultType.LLL));

        AssertClose(2564, result.FaultCurrentA, "fault current");
        Assert.Equal(0, result.NeutralVoltageV);
        Assert.Empty(result.HealthyPhaseVoltagesV);
        AssertClose(2564, result.Indicators[0].PhaseCurrentA, "FI1 phase current");
        AssertClose(2564, result.Indicators[1].PhaseCurrentA, "FI2 phase current");
        Assert.Equal(0, result.Indicators[2].PhaseCurrentA);
        Assert.Equal([IndicatorState.Fault, IndicatorState.Forward, IndicatorState.None], result.Indicators.Select(r => r.Expected));
    }

    private static void AssertClose(double expected, double actual, string what) =>
        Assert.True(Math.Abs(actual - expected) <= RelativeTolerance * Math.Abs(expected),
            $"{what}: expected {expected} ± 0.5 %, got {actual}");
}
