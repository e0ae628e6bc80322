using FeederLocate.Core.Switching;

namespace FeederLocate.Core.Tests.Switching;

public class CustomerMinutesTests
{
    [Fact]
    public void Cmi_sums_customers_times_minutes_without_supply()
    {
        // IEEE 1366: CMI = Σ customers × minutes interrupted. 1000 customers out from 0; 600 back at
        // 5 min, 300 more at 30 min, 100 never within the 45 min horizon:
        // 1000·5 + 400·25 + 100·15 = 5000 + 10000 + 1500 = 16 500.
        var cmi = CustomerMinutes.Interrupted(1000, [new(TimeSpan.FromMinutes(5), 400), new(TimeSpan.FromMinutes(30), 100)], TimeSpan.FromMinutes(45));

        Assert.Equal(16_500, cmi, 9);
    }

    [Fact]
    public void Cmi_counts_customers_cut_off_later_from_when_they_lose_supply()
    {
        // None out at the start; 200 cut off at 2 min, back at 12 min: 200·10 = 2000.
        var cmi = CustomerMinutes.Interrupted(0, [new(TimeSpan.FromMinutes(2), 200), new(TimeSpan.FromMinutes(12), 0)], TimeSpan.FromMinutes(12));

        Assert.Equal(2000, cmi, 9);
    }

    [Fact]
    public void Cmi_ignores_what_happens_after_the_horizon()
    {
        var cmi = CustomerMinutes.Interrupted(50, [new(TimeSpan.FromMinutes(20), 0)], TimeSpan.FromMinutes(10));

        Assert.Equal(500, cmi, 9);
    }

    [Fact]
    public void Cmi_rejects_changes_out_of_time_order()
    {
        Assert.Throws<ArgumentException>(() =>
            CustomerMinutes.Interrupted(10, [new(TimeSpan.FromMinutes(5), 5), new(TimeSpan.FromMinutes(1), 0)], TimeSpan.FromMinutes(9)));
    }
}
