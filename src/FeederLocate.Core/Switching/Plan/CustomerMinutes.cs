namespace FeederLocate.Core.Switching;

/// <summary>A moment at which the number of customers without supply changes.</summary>
public sealed record SupplyChange(TimeSpan At, int CustomersWithoutSupply);

/// <summary>
/// Customer minutes interrupted (IEEE 1366 CMI): Σ customers × minutes without supply, over a horizon.
/// </summary>
public static class CustomerMinutes
{
    /// <summary>
    /// CMI from the start (time zero, <paramref name="customersAtStart"/> without supply) through each
    /// change, in order of time, to <paramref name="horizon"/>. Changes after the horizon are ignored.
    /// </summary>
    public static double Interrupted(int customersAtStart, IReadOnlyList<SupplyChange> changes, TimeSpan horizon)
    {
        ArgumentNullException.ThrowIfNull(changes);
        if (customersAtStart < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(customersAtStart), customersAtStart, "must be >= 0");
        }
        var total = 0.0;
        var since = TimeSpan.Zero;
        var without = customersAtStart;
        foreach (var change in changes)
        {
            if (change.At < since)
            {
                throw new ArgumentException($"supply changes must be in order of time: {change.At} after {since}", nameof(changes));
            }

            var until = change.At < horizon ? change.At : horizon;
            total += without * Math.Max(0, (until - since).TotalMinutes);
            since = change.At;
            without = change.CustomersWithoutSupply;
        }

        total += without * Math.Max(0, (horizon - since).TotalMinutes);
        return total;
    }
}
