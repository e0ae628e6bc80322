using System.Text.Json;
using System.Text.Json.Serialization;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Database;
using FeederLocate.Storage.Errors;

namespace FeederLocate.Storage.Events;

/// <summary>
/// The stored form of each event kind: a kind name and a camelCase JSON payload. States, sources, positions
/// and fault types are written with the incident format's names; the opened incident is the incident file's text.
/// </summary>
internal static class EventPayload
{
    public const string IncidentOpenedKind = "incidentOpened";
    public const string IndicationEnteredKind = "indicationEntered";
    public const string MeasurementRecordedKind = "measurementRecorded";
    public const string SwitchStateChangedKind = "switchStateChanged";
    public const string PlanStepCompletedKind = "planStepCompleted";
    public const string OutcomeLoggedKind = "outcomeLogged";
    public const string IncidentClosedKind = "incidentClosed";
    // The stored kind keeps the name it was first written under, so older logs still read.
    public const string TripAmendedKind = "substationRecordAmended";
    public const string ProtectionRecordedKind = "protectionRecorded";
    public const string OutcomeRetractedKind = "outcomeRetracted";
    public const string PlanStepCorrectedKind = "planStepCorrected";
    public const string SwitchingDeviationRecordedKind = "switchingDeviationRecorded";
    public const string IncidentTimesEnteredKind = "incidentTimesEntered";
    public const string IncidentStageChangedKind = "incidentStageChanged";
    public const string IncidentReopenedKind = "incidentReopened";
    public const string NoFaultFoundLoggedKind = "noFaultFoundLogged";
    public const string ReturnStepCompletedKind = "returnStepCompleted";
    public const string IncidentGridMovedKind = "incidentGridMoved";

    // Required constructor parameters and nullable annotations are enforced, so a payload missing a
    // non-optional field fails to read instead of yielding nulls; optional fields have defaults.
    private static readonly JsonSerializerOptions Options = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull,
        RespectNullableAnnotations = true,
        RespectRequiredConstructorParameters = true,
    };

    public static string KindOf(IncidentEvent e) => e switch
    {
        IncidentOpened => IncidentOpenedKind,
        IndicationEntered => IndicationEnteredKind,
        MeasurementRecorded => MeasurementRecordedKind,
        SwitchStateChanged => SwitchStateChangedKind,
        PlanStepCompleted => PlanStepCompletedKind,
        OutcomeLogged => OutcomeLoggedKind,
        IncidentClosed => IncidentClosedKind,
        TripAmended => TripAmendedKind,
        ProtectionRecorded => ProtectionRecordedKind,
        OutcomeRetracted => OutcomeRetractedKind,
        UnreadableEvent u => u.StoredKind,
        PlanStepCorrected => PlanStepCorrectedKind,
        SwitchingDeviationRecorded => SwitchingDeviationRecordedKind,
        IncidentTimesEntered => IncidentTimesEnteredKind,
        IncidentStageChanged => IncidentStageChangedKind,
        IncidentReopened => IncidentReopenedKind,
        NoFaultFoundLogged => NoFaultFoundLoggedKind,
        ReturnStepCompleted => ReturnStepCompletedKind,
        IncidentGridMoved => IncidentGridMovedKind,
        _ => throw new ArgumentException($"unknown event type {e.GetType().Name}", nameof(e)),
    };

    public static string Serialize(IncidentEvent e)
    {
        ArgumentNullException.ThrowIfNull(e);
        object payload = e switch
        {
            IncidentOpened o => new OpenedPayload(o.GridName, IncidentWriter.Write(o.Incident), IsoTime.Format(o.ReportedAt), o.GridVersion),
            IndicationEntered { Indication: var i } => new IndicationPayload(
                i.Indicator.Value, IncidentFormat.Name(i.State), IncidentFormat.Name(i.Source),
                i.ReadAt is { } readAt ? IsoTime.Format(readAt) : null, i.Distrusted),
            MeasurementRecorded { Measurement: var m } => new MeasurementPayload(
                m.Device.Value, m.PhaseCurrentA, m.ResidualCurrentA, m.NeutralVoltageV),
            SwitchStateChanged s => new SwitchPayload(s.Switch.Value, IncidentFormat.Name(s.Position)),
            PlanStepCompleted p => new PlanStepPayload(p.Order, p.Action, p.Device, p.Note, p.DoneAt),
            OutcomeLogged o => new OutcomePayload(o.ConfirmedSegment.Value, IncidentFormat.Name(o.FaultType), o.Cause, o.Notes),
            IncidentClosed c => new ClosedPayload(c.Note),
            TripAmended a => new AmendedPayload(IncidentFormat.Name(a.FaultType), a.TrippedDevice?.Value),
            ProtectionRecorded p => new ProtectionPayload(ProtectionText(p)),
            OutcomeRetracted r => new RetractedPayload(r.Reason),
            UnreadableEvent => throw new ArgumentException("an unreadable event is never written", nameof(e)),
            PlanStepCorrected c => new CorrectionPayload(c.Order, c.Reason),
            SwitchingDeviationRecorded d => new DeviationPayload(d.Switch.Value, IncidentFormat.Name(d.Position), d.Reason, d.Departure),
            IncidentTimesEntered t => new TimesPayload(t.FaultAt, t.TrippedAt, t.ReclosedAt),
            IncidentStageChanged c => new StagePayload(Incidents.IncidentStages.Name(c.Stage)),
            IncidentReopened r => new ReopenedPayload(r.Reason),
            NoFaultFoundLogged n => new NoFaultFoundPayload(n.Transient, n.FaultType is { } t ? IncidentFormat.Name(t) : null, n.Notes),
            ReturnStepCompleted r => new ReturnStepPayload(r.Order, r.Action, r.Device, r.DoneAt),
            IncidentGridMoved m => new GridMovedPayload(m.FromVersion, m.ToVersion, m.Reason),
            _ => throw new ArgumentException($"unknown event type {e.GetType().Name}", nameof(e)),
        };
        return JsonSerializer.Serialize(payload, payload.GetType(), Options);
    }

    /// <summary>Reads a stored payload back; throws <see cref="CorruptEventException"/> naming the event when it cannot.</summary>
    public static IncidentEvent Deserialize(EventId id, string kind, string json)
    {
        try
        {
            return kind switch
            {
                IncidentOpenedKind => Opened(id, Read<OpenedPayload>(json)),
                IndicationEnteredKind => Indication(id, Read<IndicationPayload>(json)),
                MeasurementRecordedKind => Read<MeasurementPayload>(json).ToEvent(),
                SwitchStateChangedKind => Read<SwitchPayload>(json).ToEvent(id),
                PlanStepCompletedKind => Read<PlanStepPayload>(json).ToEvent(),
                OutcomeLoggedKind => Read<OutcomePayload>(json).ToEvent(id),
                IncidentClosedKind => new IncidentClosed(Read<ClosedPayload>(json).Note),
                TripAmendedKind => Read<AmendedPayload>(json).ToEvent(id),
                ProtectionRecordedKind => Protection(id, Read<ProtectionPayload>(json)),
                OutcomeRetractedKind => new OutcomeRetracted(Read<RetractedPayload>(json).Reason),
                PlanStepCorrectedKind => Read<CorrectionPayload>(json).ToEvent(),
                SwitchingDeviationRecordedKind => Read<DeviationPayload>(json).ToEvent(id),
                IncidentTimesEnteredKind => Read<TimesPayload>(json).ToEvent(),
                IncidentStageChangedKind => Read<StagePayload>(json).ToEvent(id),
                IncidentReopenedKind => new IncidentReopened(Read<ReopenedPayload>(json).Reason),
                NoFaultFoundLoggedKind => Read<NoFaultFoundPayload>(json).ToEvent(id),
                ReturnStepCompletedKind => Read<ReturnStepPayload>(json).ToEvent(),
                IncidentGridMovedKind => Read<GridMovedPayload>(json).ToEvent(id),
                _ => throw new CorruptEventException(id, $"has unknown kind \"{kind}\""),
            };
        }
        catch (JsonException e)
        {
            throw new CorruptEventException(id, $"has a {kind} payload that cannot be read: {e.Message}", e);
        }
        catch (Exception e) when (e is ArgumentException or FormatException or InvalidOperationException or NotSupportedException)
        {
            throw new CorruptEventException(id, $"has a {kind} payload that cannot be read: {e.Message}", e);
        }
    }

    private static T Read<T>(string json) =>
        JsonSerializer.Deserialize<T>(json, Options) ?? throw new JsonException("payload is null");

    private static IncidentOpened Opened(EventId id, OpenedPayload payload)
    {
        var read = IncidentReader.Parse(payload.Incident, grid: null);
        if (read.Value is not { } incident)
        {
            throw new CorruptEventException(id, "holds an incident that does not read back: " + string.Join("; ", read.Errors));
        }

        return payload.GridVersion is null or >= 1
            ? new IncidentOpened(payload.GridName, incident) { GridVersion = payload.GridVersion ?? 1 }
            : throw new CorruptEventException(id, $"has gridVersion {payload.GridVersion}; versions are numbered from 1");
    }

    private static IndicationEntered Indication(EventId id, IndicationPayload payload)
    {
        DateTimeOffset? readAt = null;
        if (payload.ReadAt is not null)
        {
            readAt = IsoTime.TryParse(payload.ReadAt, out var time)
                ? time
                : throw new CorruptEventException(id, $"has readAt \"{payload.ReadAt}\" that is not an ISO 8601 time");
        }

        return new IndicationEntered(new Indication(
            new IndicatorId(payload.Indicator),
            Choice(id, "state", payload.State, IncidentFormat.States),
            Choice(id, "source", payload.Source, IncidentFormat.Sources),
            readAt,
            payload.Suspect));
    }

    private static T Choice<T>(EventId id, string field, string text, IReadOnlyDictionary<string, T> names) =>
        names.TryGetValue(text, out var value)
            ? value
            : throw new CorruptEventException(id, $"has {field} \"{text}\"; expected one of {string.Join(", ", names.Keys)}");

    /// <summary>The protection fields in the incident format's own shape, inside a minimal incident document.</summary>
    private static string ProtectionText(ProtectionRecorded p) =>
        IncidentWriter.Write(new Incident(p.FaultAt ?? DateTimeOffset.UnixEpoch, null, System.Collections.Immutable.ImmutableDictionary<SwitchId, SwitchPosition>.Empty, null, null, [], [])
        {
            FaultAt = p.FaultAt,
            Reclosing = p.Reclosing,
            Fuses = p.Fuses,
            Relays = p.Relays,
        });

    private static ProtectionRecorded Protection(EventId id, ProtectionPayload payload)
    {
        var read = IncidentReader.Parse(payload.Protection, grid: null);
        if (read.Value is not { } incident)
        {
            throw new CorruptEventException(id, "holds a protection context that does not read back: " + string.Join("; ", read.Errors));
        }

        return ProtectionRecorded.Of(incident);
    }

    private sealed record ProtectionPayload(string Protection);

    // Logs written before grid versions have no gridVersion: their incidents are on version 1 of their grid.
    private sealed record OpenedPayload(string GridName, string Incident, string ReportedAt, int? GridVersion = null);

    private sealed record GridMovedPayload(int FromVersion, int ToVersion, string Reason)
    {
        public IncidentGridMoved ToEvent(EventId id) => FromVersion >= 1 && ToVersion >= 1
            ? new IncidentGridMoved(FromVersion, ToVersion, Reason)
            : throw new CorruptEventException(id, $"moves from version {FromVersion} to {ToVersion}; versions are numbered from 1");
    }

    // The stored field keeps the format's name `suspect` for the operator's distrust mark.
    private sealed record IndicationPayload(string Indicator, string State, string Source, string? ReadAt = null, bool Suspect = false);

    private sealed record MeasurementPayload(string Device, double? PhaseCurrentA = null, double? ResidualCurrentA = null, double? NeutralVoltageV = null)
    {
        public MeasurementRecorded ToEvent() =>
            new(new SubstationMeasurement(new SwitchId(Device), PhaseCurrentA, ResidualCurrentA, NeutralVoltageV));
    }

    private sealed record SwitchPayload(string Switch, string Position)
    {
        public SwitchStateChanged ToEvent(EventId id) =>
            new(new SwitchId(Switch), Choice(id, "position", Position, IncidentFormat.Positions));
    }

    private sealed record PlanStepPayload(int Order, string Action, string? Device = null, string? Note = null, DateTimeOffset? DoneAt = null)
    {
        public PlanStepCompleted ToEvent() => new(Order, Action, Device, Note, DoneAt);
    }

    private sealed record StagePayload(string Stage)
    {
        public IncidentStageChanged ToEvent(EventId id) => Incidents.IncidentStages.TryParse(Stage, out var stage)
            ? new IncidentStageChanged(stage)
            : throw new CorruptEventException(id, $"has unknown stage \"{Stage}\"");
    }

    private sealed record ReopenedPayload(string Reason);

    private sealed record NoFaultFoundPayload(bool Transient, string? FaultType = null, string? Notes = null)
    {
        public NoFaultFoundLogged ToEvent(EventId id) =>
            new(Transient, FaultType is null ? null : Choice(id, "faultType", FaultType, IncidentFormat.FaultTypes), Notes);
    }

    private sealed record ReturnStepPayload(int Order, string Action, string? Device = null, DateTimeOffset? DoneAt = null)
    {
        public ReturnStepCompleted ToEvent() => new(Order, Action, Device, DoneAt);
    }

    private sealed record TimesPayload(DateTimeOffset? FaultAt = null, DateTimeOffset? TrippedAt = null, DateTimeOffset? ReclosedAt = null)
    {
        public IncidentTimesEntered ToEvent() => new(FaultAt, TrippedAt, ReclosedAt);
    }

    private sealed record OutcomePayload(string ConfirmedSegment, string FaultType, string? Cause = null, string? Notes = null)
    {
        public OutcomeLogged ToEvent(EventId id) =>
            new(new SegmentId(ConfirmedSegment), Choice(id, "faultType", FaultType, IncidentFormat.FaultTypes), Cause, Notes);
    }

    private sealed record ClosedPayload(string? Note = null);

    private sealed record RetractedPayload(string Reason);

    private sealed record AmendedPayload(string FaultType, string? TrippedDevice = null)
    {
        public TripAmended ToEvent(EventId id) =>
            new(TrippedDevice is null ? null : new SwitchId(TrippedDevice), Choice(id, "faultType", FaultType, IncidentFormat.FaultTypes));
    }

    private sealed record CorrectionPayload(int Order, string Reason)
    {
        public PlanStepCorrected ToEvent() => new(Order, Reason);
    }

    private sealed record DeviationPayload(string Switch, string Position, string Reason, string? Departure = null)
    {
        public SwitchingDeviationRecorded ToEvent(EventId id) =>
            new(new SwitchId(Switch), Choice(id, "position", Position, IncidentFormat.Positions), Reason, Departure);
    }
}
