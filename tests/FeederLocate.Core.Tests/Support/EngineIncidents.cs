using System.Collections.Immutable;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Support;

/// <summary>
/// Incidents whose every indication is what the reference model expects for a known fault
/// (<see cref="FaultCurrents.At(EnergisedNetwork, FaultCase)"/>), for ranking tests that need the
/// truth to be beyond doubt.
/// </summary>
public static class EngineIncidents
{
    public static readonly DateTimeOffset ReportedAt = new(2026, 3, 1, 8, 0, 0, TimeSpan.Zero);

    /// <summary>The network of the grid's normal switch states with the given deviations.</summary>
    public static EnergisedNetwork Network(Grid grid, IReadOnlyDictionary<SwitchId, SwitchPosition>? deviations = null)
    {
        var states = SwitchStates.Normal(grid);
        foreach (var (id, position) in deviations ?? ImmutableDictionary<SwitchId, SwitchPosition>.Empty)
        {
            states = states.With(id, position);
        }

        return new NetworkGraph(grid).Energise(states);
    }

    /// <summary>Every indicator with the state the engine expects, reported over telecontrol.</summary>
    public static ImmutableArray<Indication> Indications(FaultResult result) =>
        [.. result.Indicators.Select(r => new Indication(r.Id, r.Expected, IndicationSource.Remote))];

    /// <summary>
    /// The records of every feeder breaker at the faulted substation's bus, read off the indicator at
    /// the breaker's far node: that indicator looks into exactly the part of the network the breaker's
    /// CTs do, so its phase and residual currents are the breaker's (the bus |U0| is common to all).
    /// The phase current is given only where it flows (the breaker feeding the fault).
    /// </summary>
    public static ImmutableArray<SubstationMeasurement> FeederRecords(Grid grid, FaultResult result, bool phase, bool earth)
    {
        var bus = grid.Substation(result.Substation).BusNode;
        var records = ImmutableArray.CreateBuilder<SubstationMeasurement>();
        foreach (var breaker in grid.Switches.Where(s => s.Kind == SwitchKind.Breaker && (s.From == bus || s.To == bus)))
        {
            var far = breaker.OtherEnd(bus);
            var head = grid.Indicators.Single(i => i.Node == far);
            var reading = result.Indicators.Single(r => r.Id == head.Id);
            records.Add(new SubstationMeasurement(
                breaker.Id,
                phase && reading.PhaseCurrentA > 0 ? reading.PhaseCurrentA : null,
                earth ? reading.ResidualCurrentA : null,
                earth ? result.NeutralVoltageV : null));
        }

        return records.ToImmutable();
    }

    /// <summary>The breaker, recloser or fuse nearest the fault on its path from the source: the one that clears it.</summary>
    public static SwitchId TrippingDevice(EnergisedNetwork network, SegmentId segment)
    {
        var grid = network.Grid;
        var supplied = network.SuppliedEndOf(grid.SegmentIndex(segment));
        var path = network.PathFromSource(grid.Nodes[supplied].Id);
        return path.Where(e => e.Kind == EdgeKind.Switch)
            .Select(e => grid.Switches[e.Index])
            .Last(s => s.Kind is SwitchKind.Breaker or SwitchKind.Recloser or SwitchKind.Fuse).Id;
    }

    /// <summary>Distance from the substation bus to a point on the segment along the energised path, km, summed by hand.</summary>
    public static double DistanceFromBusKm(EnergisedNetwork network, SegmentId segment, double position)
    {
        var grid = network.Grid;
        var index = grid.SegmentIndex(segment);
        var seg = grid.Segments[index];
        var supplied = network.SuppliedEndOf(index);
        var upToSegment = network.PathFromSource(grid.Nodes[supplied].Id)
            .Where(e => e.Kind == EdgeKind.Segment)
            .Sum(e => grid.Segments[e.Index].LengthKm);
        var fromSupply = grid.NodeIndex(seg.From) == supplied ? position : 1 - position;
        return upToSegment + (fromSupply * seg.LengthKm);
    }

    /// <summary>An incident with every indicator as the engine expects it.</summary>
    public static Incident Exact(
        FaultResult result,
        SwitchId? tripped,
        IEnumerable<SubstationMeasurement>? records = null,
        IReadOnlyDictionary<SwitchId, SwitchPosition>? deviations = null) =>
        new(
            ReportedAt,
            null,
            (deviations ?? ImmutableDictionary<SwitchId, SwitchPosition>.Empty).ToImmutableDictionary(),
            tripped,
            result.Case.Type,
            [.. records ?? []],
            Indications(result));

    /// <summary>An incident with only the given indications (every other indicator unknown), all remote.</summary>
    public static Incident WithIndications(SwitchId? tripped, FaultType? type, params (string Indicator, IndicatorState State)[] indications) =>
        new(
            ReportedAt,
            null,
            ImmutableDictionary<SwitchId, SwitchPosition>.Empty,
            tripped,
            type,
            [],
            [.. indications.Select(i => new Indication(new IndicatorId(i.Indicator), i.State, IndicationSource.Remote))]);

    /// <summary>The incident with one indication replaced.</summary>
    public static Incident With(this Incident incident, string indicator, Func<Indication, Indication> change) =>
        incident with { Indications = [.. incident.Indications.Select(i => i.Indicator.Value == indicator ? change(i) : i)] };

    /// <summary>The incident without the indication of one indicator (its report lost).</summary>
    public static Incident Without(this Incident incident, string indicator) =>
        incident with { Indications = [.. incident.Indications.Where(i => i.Indicator.Value != indicator)] };
}
