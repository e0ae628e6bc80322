using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Tests.Support;

/// <summary>
/// Equality of grids and incidents element by element: the records compare by value, their collections
/// (ImmutableArray, ImmutableDictionary) do not, so each collection is compared item by item.
/// </summary>
public static class ModelAssert
{
    public static void Equal(Grid expected, Grid actual)
    {
        Assert.Equal(expected.Name, actual.Name);
        Assert.Equal(expected.FrequencyHz, actual.FrequencyHz);
        Items(expected.LineTypes, actual.LineTypes, "line type");
        Items(expected.Substations, actual.Substations, "substation");
        Items(expected.Nodes, actual.Nodes, "node");
        Items(expected.Segments, actual.Segments, "segment");
        Items(expected.Switches, actual.Switches, "switch");
        Items(expected.Indicators, actual.Indicators, "indicator");
        Assert.Equal(expected.CrewBases.Length, actual.CrewBases.Length);
        foreach (var (e, a) in expected.CrewBases.Zip(actual.CrewBases))
        {
            // The travel times are a dictionary: compared by content, not by reference.
            Assert.Equal(e with { TravelTimes = null }, a with { TravelTimes = null });
            Assert.Equal(
                (e.TravelTimes ?? ImmutableDictionary<SwitchId, TimeSpan>.Empty).OrderBy(p => p.Key.Value, StringComparer.Ordinal),
                (a.TravelTimes ?? ImmutableDictionary<SwitchId, TimeSpan>.Empty).OrderBy(p => p.Key.Value, StringComparer.Ordinal));
        }
    }

    public static void Equal(Incident expected, Incident actual)
    {
        // With the collections blanked out the records compare every other field by value (ReportedAt,
        // GridReference, TrippedDevice, FaultType and any field added later).
        Assert.Equal(WithoutCollections(expected), WithoutCollections(actual));
        Assert.Equal(
            expected.SwitchStates.OrderBy(p => p.Key.Value, StringComparer.Ordinal),
            actual.SwitchStates.OrderBy(p => p.Key.Value, StringComparer.Ordinal));
        Items(expected.Measurements, actual.Measurements, "measurement");
        Items(expected.Indications, actual.Indications, "indication");
        Assert.Equal(
            expected.Fuses.OrderBy(p => p.Key.Value, StringComparer.Ordinal),
            actual.Fuses.OrderBy(p => p.Key.Value, StringComparer.Ordinal));
        Items(expected.Relays, actual.Relays, "relay");
    }

    private static Incident WithoutCollections(Incident incident) => incident with
    {
        SwitchStates = ImmutableDictionary<SwitchId, SwitchPosition>.Empty,
        Measurements = [],
        Indications = [],
        Fuses = ImmutableDictionary<SwitchId, FuseCondition>.Empty,
        Relays = [],
    };

    private static void Items<T>(ImmutableArray<T> expected, ImmutableArray<T> actual, string what)
    {
        Assert.True(expected.Length == actual.Length, $"{what}s: expected {expected.Length}, got {actual.Length}");
        for (var i = 0; i < expected.Length; i++)
        {
            Assert.True(EqualityComparer<T>.Default.Equals(expected[i], actual[i]), $"{what} #{i + 1}: expected {expected[i]}, got {actual[i]}");
        }
    }
}
