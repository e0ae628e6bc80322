using FeederLocate.Core.Ranking;

namespace FeederLocate.Core.Tests.Ranking;

/// <summary>The adaptive midpoint rule along a segment, against integrals that can be checked by hand.</summary>
public class PositionCellsTests
{
    [Theory]
    [InlineData(0.24, 0.02)]
    [InlineData(0.5, 0.01)]
    [InlineData(0.93, 0.03)]
    public void A_narrow_peak_between_the_first_positions_is_integrated_and_found(double peak, double width)
    {
        // log L(x) = −(x − peak)² / (2·width²): ∫₀¹ L dx = width·√(2π) while the peak lies well inside (Gaussian integral).
        double Log(double x) => -((x - peak) * (x - peak)) / (2 * width * width);
        var cells = PositionCells.At([0.1, 0.3, 0.5, 0.7, 0.9], Log);

        cells.Refine(Log, cells.MaximumLog - PositionCells.PeakWindowNats);

        Assert.Equal(Math.Log(width * Math.Sqrt(2 * Math.PI)), cells.LogMean, 0.05);
        Assert.InRange(cells.BestPosition, peak - width, peak + width);
    }

    [Fact]
    public void A_flat_likelihood_is_left_at_its_first_positions()
    {
        var evaluated = 0;
        double Log(double x)
        {
            evaluated++;
            return -3 + (0.5 * x);
        }

        var cells = PositionCells.At([0.1, 0.3, 0.5, 0.7, 0.9], Log);
        cells.Refine(Log, double.NegativeInfinity);

        Assert.Equal(5, evaluated);
        // The mean of e^(−3 + x/2) at the five centres: within 0.1 % of ∫₀¹ = 2(e^−2.5 − e^−3) (midpoint rule).
        Assert.Equal(Math.Log(2 * (Math.Exp(-2.5) - Math.Exp(-3))), cells.LogMean, 0.001);
    }
}
