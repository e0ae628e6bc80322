namespace FeederLocate.Web.Services;

/// <summary>A time of day typed on a page (UTC) as a moment: today's date, or yesterday's when the time is still to come today.</summary>
public static class ReadingTime
{
    public static DateTimeOffset On(DateTimeOffset now, TimeOnly time)
    {
        var at = new DateTimeOffset(DateOnly.FromDateTime(now.UtcDateTime), time, TimeSpan.Zero);
        return at > now.AddMinutes(1) ? at.AddDays(-1) : at;
    }
}
