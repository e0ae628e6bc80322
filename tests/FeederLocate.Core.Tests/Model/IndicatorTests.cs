using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Tests.Model;

/// <summary>The indicator's rule (common practice for fault passage indicators; pickups invented for the test).</summary>
public class IndicatorTests
{
    private static Indicator Make(double? phasePickupA, double? earthPickupA, bool directional) =>
        new(new IndicatorId("FI"), new SegmentId("S1"), new NodeId("N1"), phasePickupA, earthPickupA, directional, Remote: true);

    [Theory]
    [InlineData(399.9, 0, IndicatorState.None)]
    [InlineData(400, 0, IndicatorState.Fault)]
    [InlineData(0, 7.9, IndicatorState.None)]
    [InlineData(0, 8, IndicatorState.Fault)]
    public void Non_directional_indicator_reports_fault_once_either_element_reaches_its_pickup(double phaseA, double residualA, IndicatorState expected)
    {
        Assert.Equal(expected, Make(400, 8, directional: false).ExpectedState(phaseA, residualA, faultForward: true));
    }

    [Theory]
    [InlineData(true, IndicatorState.Forward)]
    [InlineData(false, IndicatorState.Reverse)]
    public void Directional_indicator_reports_the_side_the_fault_lies_on(bool forward, IndicatorState expected)
    {
        var indicator = Make(400, 8, directional: true);

        Assert.Equal(expected, indicator.ExpectedState(500, 0, forward));
        Assert.Equal(expected, indicator.PickedUpState(forward));
        Assert.Equal(IndicatorState.None, indicator.ExpectedState(10, 1, forward));
    }

    [Fact]
    public void An_absent_element_never_picks_up()
    {
        var earthOnly = Make(null, 8, directional: false);
        var phaseOnly = Make(400, null, directional: false);

        Assert.Equal(IndicatorState.None, earthOnly.ExpectedState(1e6, 0, faultForward: true));
        Assert.Equal(IndicatorState.None, phaseOnly.ExpectedState(0, 1e6, faultForward: true));
        Assert.Equal(IndicatorState.Fault, earthOnly.ExpectedState(0, 8, faultForward: true));
    }
}
