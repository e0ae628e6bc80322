using FeederLocate.Core.Switching;
using FeederLocate.Core.Tests.Support;

namespace FeederLocate.Core.Tests.Switching;

public class RadialLoadFlowTests
{
    // Hand-worked two-node case (common practice, any distribution textbook): 20 kV busbar, one line of
    // Z = 1 + j2 Ω per phase, a load of 3 MW + j1 Mvar (three-phase). Per phase V1 = 20 kV/√3 = 11 547 V,
    // P = 1 MW, Q = 1/3 Mvar. The exact receiving voltage solves the two-bus power-flow quartic
    //   V2⁴ − (V1² − 2(RP + XQ))·V2² + |Z|²(P² + Q²) = 0,
    // and the familiar estimate of the drop is ΔV ≈ (R·P + X·Q)/V = 1.667e6/11 547 ≈ 144.3 V (1.25 %).
    // The estimate leaves out the quadrature part (X·P − R·Q)/V and the rise of the current as V2 falls,
    // each worth about 1-2 V here, so it is checked to 5 V.
    private const double R = 1.0;
    private const double X = 2.0;
    private const double PhaseP = 1e6;
    private const double PhaseQ = 1e6 / 3;

    private static readonly double V1 = 20e3 / Math.Sqrt(3);

    private static double ExactV2()
    {
        var b = (V1 * V1) - (2 * ((R * PhaseP) + (X * PhaseQ)));
        var c = ((R * R) + (X * X)) * ((PhaseP * PhaseP) + (PhaseQ * PhaseQ));
        return Math.Sqrt((b + Math.Sqrt((b * b) - (4 * c))) / 2);
    }

    [Fact]
    public void Sweep_matches_the_exact_two_node_voltage()
    {
        var grid = SwitchingGrids.TwoNode(R, X, 3000, 1000);
        var flow = RadialLoadFlow.Solve(Grids.Normal(grid));

        Assert.True(flow.Converged);
        Assert.Equal(ExactV2() / V1, flow.VoltagePu[grid.NodeIndex(new("N2"))], 1e-6);
        Assert.Equal(1.0, flow.VoltagePu[grid.NodeIndex(new("N1"))], 12);
    }

    [Fact]
    public void Voltage_drop_is_close_to_the_r_p_plus_x_q_over_v_estimate()
    {
        var grid = SwitchingGrids.TwoNode(R, X, 3000, 1000);
        var flow = RadialLoadFlow.Solve(Grids.Normal(grid));

        var dropV = V1 * (1 - flow.VoltagePu[grid.NodeIndex(new("N2"))]);
        var estimateV = ((R * PhaseP) + (X * PhaseQ)) / V1;
        Assert.Equal(144.34, estimateV, 0.01);
        Assert.Equal(estimateV, dropV, 5.0);
    }

    [Fact]
    public void Segment_current_is_the_apparent_power_over_the_receiving_voltage()
    {
        var grid = SwitchingGrids.TwoNode(R, X, 3000, 1000);
        var flow = RadialLoadFlow.Solve(Grids.Normal(grid));

        var expectedA = Math.Sqrt((PhaseP * PhaseP) + (PhaseQ * PhaseQ)) / ExactV2();
        Assert.Equal(expectedA, flow.SegmentCurrentA[0], 1e-3);

        // Bus output: the load's 3.162 MVA plus the line's losses 3·I²·|Z| (a few kVA), three phases.
        var loadMva = 3 * Math.Sqrt((PhaseP * PhaseP) + (PhaseQ * PhaseQ)) / 1e6;
        Assert.InRange(flow.SubstationLoadMva[0], loadMva, loadMva + (3 * expectedA * expectedA * Math.Sqrt(5) / 1e6) + 1e-6);
    }

    [Fact]
    public void Missing_load_kvar_means_power_factor_0_95_lagging()
    {
        // Q = P·tan(acos 0.95) = 0.3287·P (common practice for a load without reactive data).
        var given = RadialLoadFlow.Solve(Grids.Normal(SwitchingGrids.TwoNode(R, X, 3000, 3000 * Math.Tan(Math.Acos(0.95)))));
        var absent = RadialLoadFlow.Solve(Grids.Normal(SwitchingGrids.TwoNode(R, X, 3000, null)));

        Assert.Equal(given.VoltagePu[2], absent.VoltagePu[2], 12);
        Assert.NotEqual(1.0, absent.VoltagePu[2], 3);
    }

    [Fact]
    public void Load_factor_scales_the_load_like_a_bigger_load()
    {
        var grid = SwitchingGrids.TwoNode(R, X, 1500, 500);
        var doubled = RadialLoadFlow.Solve(Grids.Normal(grid), [1, 1, 2]);
        var bigger = RadialLoadFlow.Solve(Grids.Normal(SwitchingGrids.TwoNode(R, X, 3000, 1000)));

        Assert.Equal(bigger.VoltagePu[2], doubled.VoltagePu[2], 12);
    }

    [Fact]
    public void Impossible_load_is_reported_as_not_converged()
    {
        // 300 MW over 1 + j2 Ω cannot be delivered at 20 kV: no real solution of the quartic exists.
        var flow = RadialLoadFlow.Solve(Grids.Normal(SwitchingGrids.TwoNode(R, X, 300_000, 100_000)));

        Assert.False(flow.Converged);
    }
}
