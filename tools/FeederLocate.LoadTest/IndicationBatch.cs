using System.Globalization;
using System.Text.Json.Nodes;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;

namespace FeederLocate.LoadTest;

/// <summary>A batch of indications for one incident, as posted, and the same in the API's JSON.</summary>
public sealed record IndicationBatch(IReadOnlyList<Indication> Indications)
{
    public const int MaximumSize = 3;

    /// <summary>
    /// One to three distinct indicators of the grid, each with a state it can show (fault or none for
    /// a non-directional indicator, forward, reverse or none for a directional one, or unknown), its
    /// own source, and a reading time from <paramref name="clock"/>.
    /// </summary>
    public static IndicationBatch Random(Random random, Grid grid, ReadingClock clock)
    {
        ArgumentNullException.ThrowIfNull(random);
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(clock);
        var size = Math.Min(random.Next(1, MaximumSize + 1), grid.Indicators.Length);
        var picked = grid.Indicators.ToArray();
        random.Shuffle(picked);
        return new IndicationBatch([.. picked.Take(size).Select(indicator =>
        {
            var states = StatesOf(indicator);
            return new Indication(indicator.Id, states[random.Next(states.Count)],
                indicator.Remote ? IndicationSource.Remote : IndicationSource.Field, clock.Next());
        })]);
    }

    /// <summary>The states the incident format allows for <paramref name="indicator"/>.</summary>
    public static IReadOnlyList<IndicatorState> StatesOf(Indicator indicator)
    {
        ArgumentNullException.ThrowIfNull(indicator);
        return indicator.Directional
            ? [IndicatorState.Forward, IndicatorState.Reverse, IndicatorState.None, IndicatorState.Unknown]
            : [IndicatorState.Fault, IndicatorState.None, IndicatorState.Unknown];
    }

    /// <summary>The batch as the indications endpoint takes it: an array of the incident format's indication objects.</summary>
    public string ToJson()
    {
        var array = new JsonArray();
        foreach (var i in Indications)
        {
            array.Add(new JsonObject
            {
                ["indicator"] = i.Indicator.Value,
                ["state"] = IncidentFormat.Name(i.State),
                ["source"] = IncidentFormat.Name(i.Source),
                ["readAt"] = i.ReadAt?.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss.fff'Z'", CultureInfo.InvariantCulture),
            });
        }

        return array.ToJsonString();
    }
}
