using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// The protection context of an incident as likelihood factors for a fault on a segment: blown fuses
/// put the fault beyond them; intact fuses that the fault current would have blown put it elsewhere;
/// a directional or wattmetric earth-fault element's direction selects the feeder; a fault locator's
/// reactance narrows the distance along the path; the reclosing device, like a tripped one, saw the
/// fault beyond it. Every factor is 1 where the incident gives no such evidence.
/// </summary>
internal sealed class ProtectionEvidence
{
    /// <summary>Positions along a segment (fraction from the supplied end) over which a fault locator's reactance is averaged.</summary>
    private static readonly double[] ReactancePositions = [0.05, 0.15, 0.25, 0.35, 0.45, 0.55, 0.65, 0.75, 0.85, 0.95];

    private readonly FaultResponseModel _model;
    private readonly RankingOptions _options;
    private readonly bool[] _lowCurrentEarthing;
    private readonly List<MeasuringPoint> _blown = [];
    private readonly List<(MeasuringPoint Point, double? RatedCurrentA)> _intact = [];
    private readonly List<(MeasuringPoint Point, EarthFaultDirection Direction)> _directions = [];
    private readonly List<(MeasuringPoint Point, int FarNode, double ReactanceOhm, double UniformDensity)> _reactances = [];
    private readonly MeasuringPoint? _reclosing;
    private readonly double _maximumTrippingEarthFaultOhm;
    private readonly double[,] _directionLog;
    private readonly double[] _directionBaseLog;
    private readonly double _directionOtherLog;
    private readonly PointsAbove _directionsAbove;
    private readonly PointsAbove _intactAbove;
    private readonly List<int> _beyond = [];

    public ProtectionEvidence(FaultResponseModel model, Incident incident, RankingOptions options)
    {
        _model = model;
        _options = options;
        var grid = model.Grid;
        _lowCurrentEarthing = [.. grid.Substations.Select(s => s.Grounding.Scheme is GroundingScheme.Isolated or GroundingScheme.Resonant)];
        _maximumTrippingEarthFaultOhm = options.LowResistanceEarthFaultOhms.IsDefaultOrEmpty ? 0 : options.LowResistanceEarthFaultOhms.Max();
        var directions = Enum.GetValues<EarthFaultDirection>();
        _directionLog = new double[directions.Length, directions.Length];
        foreach (var reported in directions)
        {
            foreach (var expected in directions)
            {
                _directionLog[(int)reported, (int)expected] = Math.Log(DirectionProbability(reported, expected));
            }
        }
        foreach (var (id, condition) in incident.Fuses)
        {
            var index = grid.SwitchIndex(id);
            var point = model.SwitchPoint(index);
            if (condition == FuseCondition.Blown)
            {
                _blown.Add(point);
            }
            else
            {
                _intact.Add((point, grid.Switches[index].RatedCurrentA));
            }
        }

        var network = model.Network;
        foreach (var relay in incident.Relays.IsDefault ? [] : incident.Relays)
        {
            var point = model.SwitchPoint(grid.SwitchIndex(relay.Device));
            if (relay.EarthFaultDirection is { } direction)
            {
                _directions.Add((point, direction));
            }

            if (relay.FaultReactanceOhm is { } reactance && point.Substation >= 0)
            {
                // A reading where the fault is not beyond the device is an error, its value anywhere from
                // zero to the largest reactance of the network behind the bus.
                var span = Enumerable.Range(0, grid.Nodes.Length)
                    .Where(v => network.SubstationIndexOf(v) == point.Substation)
                    .Max(v => model.Aggregates.PositiveSequencePathOhm(v).Imaginary);
                _reactances.Add((point, point.FarNode, reactance, 1 / (Math.Max(span, reactance) + 1)));
            }
        }

        if (incident.Reclosing is { } reclosing && reclosing.Device != incident.TrippedDevice)
        {
            _reclosing = model.SwitchPoint(grid.SwitchIndex(reclosing.Device));
        }

        _directionBaseLog = new double[grid.Substations.Length];
        for (var sub = 0; sub < _directionBaseLog.Length; sub++)
        {
            foreach (var (point, direction) in _directions)
            {
                _directionBaseLog[sub] += _directionLog[(int)direction, (int)(point.Substation == sub ? EarthFaultDirection.Reverse : EarthFaultDirection.None)];
            }
        }

        _directionOtherLog = _directions.Sum(d => _directionLog[(int)d.Direction, (int)EarthFaultDirection.None]);
        _directionsAbove = new PointsAbove(network, [.. _directions.Select(d => d.Point)]);
        _intactAbove = new PointsAbove(network, [.. _intact.Select(f => f.Point)]);
        HasResistanceTerms = _intact.Count > 0;
        IsEmpty = _blown.Count == 0 && _intact.Count == 0 && _directions.Count == 0 && _reactances.Count == 0 && _reclosing is null;
    }

    /// <summary>True where no factor depends on the fault resistance (no intact fuse given).</summary>
    public bool HasResistanceTerms { get; }

    /// <summary>True where the incident gives no protection evidence the ranking uses.</summary>
    public bool IsEmpty { get; }

    /// <summary>
    /// Log-factor of the evidence that depends on where the fault is and its type, not on its resistance.
    /// The parts that do not depend on the type, and the intact fuses with the fault beyond them, are worked
    /// out once per segment (the last segment asked for is kept) and reused for each type and resistance.
    /// </summary>
    public double TypeLog(int segment, FaultType type, int substation)
    {
        if (IsEmpty)
        {
            return 0;
        }

        if (_cached.Segment != segment || _cached.Substation != substation)
        {
            _cached = Prepare(segment, substation);
        }

        var earth = type is FaultType.LG or FaultType.LLG;
        var log = _cached.PlaceLog + (earth ? _cached.EarthDirectionLog : _cached.OtherDirectionLog);
        return _reactances.Count > 0 && !(type == FaultType.LG && _lowCurrentEarthing[substation]) ? log + _cached.ReactanceLog : log;
    }

    /// <summary>The type-independent factors of one segment and its intact fuses with the fault beyond them.</summary>
    private sealed record SegmentTerms(int Segment, int Substation, double PlaceLog, double EarthDirectionLog, double OtherDirectionLog, double ReactanceLog, double?[] IntactBeyondRatingsA);

    private SegmentTerms _cached = new(-1, -1, 0, 0, 0, 0, []);

    private SegmentTerms Prepare(int segment, int substation)
    {
        var place = 0.0;
        foreach (var point in _blown)
        {
            place += _model.IsFaultBeyond(point, segment) ? 0 : Math.Log(_options.FuseErrorProbability);
        }

        if (_reclosing is { } reclosing && !_model.IsFaultBeyond(reclosing, segment))
        {
            place += Math.Log(_options.OutsideTrippedZoneFactor);
        }

        // Directions: every relay as if the fault were not beyond it, then those with it beyond (the chain above the segment).
        var up = _model.Network.SuppliedEndOf(segment);
        var earthLog = _directionBaseLog[substation];
        _beyond.Clear();
        _directionsAbove.Collect(up, _beyond);
        foreach (var k in _beyond)
        {
            var reported = (int)_directions[k].Direction;
            earthLog += _directionLog[reported, (int)EarthFaultDirection.Forward] - _directionLog[reported, (int)EarthFaultDirection.Reverse];
        }

        var reactanceLog = 0.0;
        foreach (var reading in _reactances)
        {
            reactanceLog += ReactanceLog(reading, segment);
        }

        _beyond.Clear();
        _intactAbove.Collect(up, _beyond);
        var intact = _beyond.Select(k => _intact[k].RatedCurrentA).ToArray();

        return new SegmentTerms(segment, substation, place, earthLog, _directionOtherLog, reactanceLog, intact);
    }

    /// <summary>Log-factor of the intact fuses for a solved fault: the fault is not beyond one its current would have blown.</summary>
    public double FaultLog(int segment, in FaultSolution fault, double faultResistanceOhm)
    {
        var log = 0.0;
        if (_cached.Segment == segment && _cached.Substation == fault.Substation)
        {
            foreach (var rating in _cached.IntactBeyondRatingsA)
            {
                if (WouldBlow(rating, fault, faultResistanceOhm))
                {
                    log += Math.Log(_options.FuseErrorProbability);
                }
            }

            return log;
        }

        foreach (var (point, rating) in _intact)
        {
            if (_model.IsFaultBeyond(point, segment) && WouldBlow(rating, fault, faultResistanceOhm))
            {
                log += Math.Log(_options.FuseErrorProbability);
            }
        }

        return log;
    }

    /// <summary>
    /// Above its rating; without one, for any short circuit and for an earth fault on a solid or impedance
    /// network in the tripping range of fault resistance (common practice). An earth fault on an isolated
    /// or resonant network, or a high-resistance one that trips nothing, does not blow an unrated fuse.
    /// </summary>
    private bool WouldBlow(double? ratedCurrentA, in FaultSolution fault, double faultResistanceOhm)
    {
        if (fault.Type == FaultType.LG && _lowCurrentEarthing[fault.Substation])
        {
            return false;
        }

        if (ratedCurrentA is { } rating)
        {
            return fault.FaultedPhaseCurrentA > rating;
        }

        return fault.Type != FaultType.LG || faultResistanceOhm <= _maximumTrippingEarthFaultOhm;
    }

    /// <summary>
    /// P(reported | expected) with error rate e. Where the fault is elsewhere on the same network the
    /// element may point reverse or stay silent (its feeder's own charging current may lie under its
    /// setting), so reverse and none share 1 − e.
    /// </summary>
    private double DirectionProbability(EarthFaultDirection reported, EarthFaultDirection expected)
    {
        var e = _options.RelayErrorProbability;
        return (expected, reported) switch
        {
            (EarthFaultDirection.Forward, EarthFaultDirection.Forward) => 1 - e,
            (EarthFaultDirection.Forward, _) => e / 2,
            (EarthFaultDirection.Reverse, EarthFaultDirection.Forward) => e,
            (EarthFaultDirection.Reverse, _) => (1 - e) / 2,
            (_, EarthFaultDirection.None) => 1 - e,
            _ => e / 2,
        };
    }

    /// <summary>
    /// The reading's density averaged over positions along the segment: (1 − e)·robust density around the
    /// line reactance from the device to the fault, plus e spread evenly over the network's reactance range;
    /// only the spread term where the fault is not beyond the device.
    /// </summary>
    private double ReactanceLog((MeasuringPoint Point, int FarNode, double ReactanceOhm, double UniformDensity) reading, int segment)
    {
        var e = _options.RelayErrorProbability;
        var spread = e * reading.UniformDensity;
        if (!_model.IsFaultBeyond(reading.Point, segment))
        {
            return Math.Log(spread);
        }

        var network = _model.Network;
        var grid = network.Grid;
        var up = network.SuppliedEndOf(segment);
        var start = _model.Aggregates.PositiveSequencePathOhm(reading.FarNode).Imaginary;
        var x1 = grid.LineTypeOf(grid.Segments[segment]).X1OhmPerKm * grid.Segments[segment].LengthKm;
        var atUp = _model.Aggregates.PositiveSequencePathOhm(up).Imaginary - start;
        var sum = 0.0;
        foreach (var position in ReactancePositions)
        {
            var predicted = Math.Max(0, atUp + (position * x1));
            sum += ((1 - e) * Math.Exp(MeasurementLikelihood.Log(_options.FaultReactanceTolerance, reading.ReactanceOhm, predicted))) + spread;
        }

        return Math.Log(sum / ReactancePositions.Length);
    }
}
