using FeederLocate.Core.Model;
using FeederLocate.Core.Tests.ReferenceCases;
using FeederLocate.Core.Tests.Support;

namespace FeederLocate.Core.Tests.Formats;

public class LineTypeCatalogueTests
{
    public static TheoryData<string> Schemes => new() { "isolated", "resonant", "solid", "impedance" };

    [Theory]
    [MemberData(nameof(Schemes))]
    public void Cable_positive_sequence_resistance_is_the_IEC_60228_maximum_at_20_C(string scheme)
    {
        // IEC 60909-0 takes conductor resistance at 20 °C for maximum short-circuit currents, so r1 of
        // each cable type is the IEC 60228 Table 2 value for its material and cross-section (± 0.0005 Ω/km,
        // the table's last digit).
        var cables = Grids.Sample(scheme).LineTypes.Where(t => t.Construction == Construction.Cable).ToList();

        Assert.NotEmpty(cables);
        Assert.All(cables, t =>
        {
            Assert.NotNull(t.ConductorMaterial);
            Assert.NotNull(t.CrossSectionMm2);
            var expected = Iec60228ConductorResistance.MaximumOhmPerKmAt20C[(t.ConductorMaterial!, t.CrossSectionMm2!.Value)];
            Assert.Equal(expected, t.R1OhmPerKm, 0.0005);
            Assert.Contains("IEC 60228", t.DataSource, StringComparison.Ordinal);
        });
    }

    [Theory]
    [MemberData(nameof(Schemes))]
    public void Every_line_type_names_where_its_data_come_from(string scheme)
    {
        Assert.All(Grids.Sample(scheme).LineTypes, t => Assert.False(string.IsNullOrWhiteSpace(t.DataSource), $"line type {t.Id} has no dataSource"));
    }

    [Theory]
    // Published cable handbook table (Heuck 2013), as in shared/CHECK-VALUES.md: 12/20 kV Al XLPE
    // 150 mm² 250 nF/km → 2.721 A/km; 240 mm² 304 nF/km → 3.308 A/km (I_C = 3ωC0·Un/√3 at 20 kV).
    // The engine's bolted earth fault on 1 km of such cable in an isolated network, with c = 1.0 so
    // E = Un/√3, gives that current; the series impedance of 1 km lifts it by far less than 0.5 %.
    [InlineData(250, 2.721)]
    [InlineData(304, 3.308)]
    public void Bolted_earth_fault_on_one_km_of_isolated_cable_draws_the_handbook_charging_current(double c0NfPerKm, double amperesPerKm)
    {
        var grid = SmallGrids.SingleCable("""{ "scheme": "isolated" }""", 1.0, c0NfPerKm);

        var result = FeederLocate.Core.Electrical.FaultCurrents.At(grid, new FeederLocate.Core.Electrical.FaultCase(new SegmentId("S1"), 1.0, FeederLocate.Core.Evidence.FaultType.LG, 0, VoltageFactor: 1.0));

        Assert.Equal(amperesPerKm, result.FaultCurrentA, amperesPerKm * 0.005);
    }
}
