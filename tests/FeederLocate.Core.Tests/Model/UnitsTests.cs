using FeederLocate.Core.Model;

namespace FeederLocate.Core.Tests.Model;

public class UnitsTests
{
    [Fact]
    public void Phase_voltage_of_a_20_kV_system_is_its_line_voltage_over_root_three()
    {
        // U_phase = U_line/√3 for a balanced three-phase system (common practice); 20 000/√3 = 11 547.005 V.
        Assert.Equal(11_547.005, Units.PhaseVoltageV(20), 1e-3);
    }

    [Fact]
    public void Phase_voltage_carries_the_voltage_factor()
    {
        // IEC 60909-0: equivalent source c·Un/√3 with cmax = 1.1 for medium voltage; 1.1·20 000/√3 = 12 701.706 V.
        Assert.Equal(12_701.706, Units.PhaseVoltageV(20, 1.1), 1e-3);
    }

    [Fact]
    public void Nanofarads_per_km_become_farads_per_km()
    {
        // 1 nF = 1e-9 F (SI prefix nano).
        Assert.Equal(2.5e-7, Units.FaradsPerKm(250), 1e-20);
    }

    [Fact]
    public void A_rate_per_100_km_year_is_a_hundredth_per_km_year()
    {
        // Fault statistics quote faults per 100 km·year (common practice); 5 per 100 km·year = 0.05 per km·year.
        Assert.Equal(0.05, Units.PerKmYear(5), 1e-15);
    }
}
