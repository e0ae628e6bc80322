using System.Collections.Immutable;
using System.Globalization;
using System.Text.Json;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Formats;

/// <summary>
/// Reads an incident file (<c>feederlocate-incident/1</c>) and, given its grid, checks every reference
/// against it. Every problem is reported with its element and field; no incident is built while any
/// error remains.
/// </summary>
public static class IncidentReader
{
    private const string IncidentKind = "incident";

    public static LoadResult<Incident> Parse(string json, Grid? grid)
    {
        try
        {
            return Read(json, grid);
        }
        catch (InvalidOperationException e) when (e.Message.Contains("UTF", StringComparison.OrdinalIgnoreCase) || e.Message.Contains("surrogate", StringComparison.OrdinalIgnoreCase) || e.InnerException is System.Text.DecoderFallbackException)
        {
            return new LoadResult<Incident>(null, [GridReader.NotText(IncidentKind)]);
        }
        catch (ArgumentException)
        {
            return new LoadResult<Incident>(null, [GridReader.NotText(IncidentKind)]);
        }
    }

    /// <summary>
    /// Reads indications given on their own (one indication object, or an array of them, as in an incident
    /// file's <c>indications</c>) and checks them against <paramref name="grid"/> when given. Every problem is
    /// reported with the same element and field as in a file; no indication is returned while any error remains.
    /// </summary>
    public static LoadResult<IReadOnlyList<Indication>> ParseIndications(string json, Grid? grid, DateTimeOffset? faultAt = null) =>
        ParseItems<Indication>(json, "indications", (items, log) => IndicationItems(items, grid, log, faultAt));

    /// <summary>
    /// Reads substation measurements given on their own (one object or an array, as in an incident file's
    /// <c>measurements</c>), with the same messages as in a file; none is returned while any error remains.
    /// </summary>
    public static LoadResult<IReadOnlyList<SubstationMeasurement>> ParseMeasurements(string json, Grid? grid) =>
        ParseItems<SubstationMeasurement>(json, "measurements", (items, log) => MeasurementItems(items, grid, log));

    private static LoadResult<IReadOnlyList<T>> ParseItems<T>(string json, string kind, Func<IEnumerable<JsonElement>, IssueLog, ImmutableArray<T>> read)
    {
        try
        {
            var log = new IssueLog();
            using var document = JsonText.ParseAny(json, kind, log);
            if (document is null)
            {
                return new LoadResult<IReadOnlyList<T>>(null, log.Issues);
            }

            var root = document.RootElement;
            if (root.ValueKind is not (JsonValueKind.Object or JsonValueKind.Array))
            {
                log.Error(kind, "body", string.Empty, $"must be one object or an array of them, got {ElementReader.Describe(root)}");
                return new LoadResult<IReadOnlyList<T>>(null, log.Issues);
            }

            var items = read(root.ValueKind == JsonValueKind.Array ? root.EnumerateArray() : [root], log);
            return new LoadResult<IReadOnlyList<T>>(log.HasErrors ? null : items, log.Issues);
        }
        catch (InvalidOperationException e) when (e.Message.Contains("UTF", StringComparison.OrdinalIgnoreCase) || e.Message.Contains("surrogate", StringComparison.OrdinalIgnoreCase) || e.InnerException is System.Text.DecoderFallbackException)
        {
            return new LoadResult<IReadOnlyList<T>>(null, [GridReader.NotText(kind)]);
        }
        catch (ArgumentException)
        {
            return new LoadResult<IReadOnlyList<T>>(null, [GridReader.NotText(kind)]);
        }
    }

    private static LoadResult<Incident> Read(string json, Grid? grid)
    {
        var log = new IssueLog();
        using var document = JsonText.Parse(json, IncidentKind, log);
        if (document is null)
        {
            return new LoadResult<Incident>(null, log.Issues);
        }

        var root = new ElementReader(document.RootElement, IncidentKind, "file", log);
        var format = root.RequiredString("format");
        if (format is not null && format != IncidentFormat.FormatTag)
        {
            root.Error("format", $"must be \"{IncidentFormat.FormatTag}\", got \"{format}\"");
            return new LoadResult<Incident>(null, log.Issues);
        }

        var gridReference = root.OptionalString("grid");
        var reportedAt = Time(root, "reportedAt", required: true);
        var switchStates = SwitchStates(root, grid, log);
        var tripped = TrippedDevice(root, grid);
        FaultType? faultType = null;
        var faultTypeText = root.RequiredString("faultType");
        if (faultTypeText is not null && !IncidentFormat.FaultTypes.TryGetValue(faultTypeText, out faultType))
        {
            root.Error("faultType", $"must be one of {string.Join(", ", IncidentFormat.FaultTypes.Keys.Select(k => $"\"{k}\""))}, got \"{faultTypeText}\"");
        }

        var reenergisedAt = Time(root, "reenergisedAt", required: false);
        var faultAt = Time(root, "faultAt", required: false);
        var measurements = Measurements(root, grid, log);
        var indications = Indications(root, grid, log, faultAt);
        var protection = ProtectionReader.Read(root, grid, log);
        if (faultAt is { } began && reportedAt is { } reported && reported < began)
        {
            root.Error("faultAt", $"{Text(began)} is later than reportedAt {Text(reported)}: a fault is reported after it began");
        }

        root.WarnUnknownFields();
        if (log.HasErrors)
        {
            return new LoadResult<Incident>(null, log.Issues);
        }

        var incident = new Incident(reportedAt!.Value, gridReference, switchStates, tripped, faultType, measurements, indications, reenergisedAt)
        {
            FaultAt = faultAt,
            Reclosing = protection.Reclosing,
            Fuses = protection.Fuses,
            Relays = protection.Relays,
        };
        return new LoadResult<Incident>(incident, log.Issues);
    }

    internal static string Text(DateTimeOffset time) =>
        time.ToUniversalTime().ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture);

    private static DateTimeOffset? Time(ElementReader reader, string field, bool required)
    {
        var text = required ? reader.RequiredString(field) : reader.OptionalString(field);
        if (text is null)
        {
            return null;
        }

        if (DateTimeOffset.TryParse(text, CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal, out var time)
            && text.Contains('T', StringComparison.Ordinal))
        {
            if (EvidenceLimits.IsAcceptedTime(time))
            {
                return time;
            }

            reader.Error(field, $"{EvidenceLimits.TimeRange}, got \"{text}\"");
            return null;
        }

        reader.Error(field, $"must be an ISO 8601 date and time such as 2026-11-30T06:12:00Z, got \"{text}\"");
        return null;
    }

    private static ImmutableDictionary<SwitchId, SwitchPosition> SwitchStates(ElementReader root, Grid? grid, IssueLog log)
    {
        var states = ImmutableDictionary.CreateBuilder<SwitchId, SwitchPosition>();
        if (root.Raw("switchStates") is not { } raw || raw.ValueKind == JsonValueKind.Null)
        {
            return states.ToImmutable();
        }

        if (raw.ValueKind != JsonValueKind.Object)
        {
            root.Error("switchStates", $"must be an object of switch id to \"open\" or \"closed\", got {ElementReader.Describe(raw)}");
            return states.ToImmutable();
        }

        foreach (var property in raw.EnumerateObject())
        {
            var id = new SwitchId(property.Name);
            if (grid is not null && !grid.HasSwitch(id))
            {
                log.Error("incident", "file", $"switchStates.{property.Name}", "refers to unknown switch");
                continue;
            }

            if (property.Value.ValueKind == JsonValueKind.String
                && IncidentFormat.Positions.TryGetValue(property.Value.GetString()!, out var position))
            {
                states[id] = position;
            }
            else
            {
                log.Error("incident", "file", $"switchStates.{property.Name}", $"must be \"open\" or \"closed\", got {ElementReader.Describe(property.Value)}");
            }
        }

        return states.ToImmutable();
    }

    private static SwitchId? TrippedDevice(ElementReader root, Grid? grid)
    {
        var text = root.OptionalString("trippedDevice");
        if (text is null)
        {
            return null;
        }

        var id = new SwitchId(text);
        if (grid is null)
        {
            return id;
        }

        if (!grid.HasSwitch(id))
        {
            root.Error("trippedDevice", $"refers to unknown switch \"{text}\"");
        }
        else if (grid.Switch(id).Kind is not (SwitchKind.Breaker or SwitchKind.Recloser or SwitchKind.Fuse))
        {
            root.Error("trippedDevice", $"must be a breaker, recloser or fuse; {text} is a {GridFormat.Name(grid.Switch(id).Kind)}");
        }

        return id;
    }

    private static ImmutableArray<SubstationMeasurement> Measurements(ElementReader root, Grid? grid, IssueLog log)
    {
        return root.Array("measurements", required: false) is { } array ? MeasurementItems(array, grid, log) : [];
    }

    private static ImmutableArray<SubstationMeasurement> MeasurementItems(IEnumerable<JsonElement> array, Grid? grid, IssueLog log)
    {
        var measurements = ImmutableArray.CreateBuilder<SubstationMeasurement>();
        var count = array.Count();
        if (count > EvidenceLimits.MaxMeasurementsPerIncident)
        {
            log.Error("incident", "file", "measurements", $"holds {count} records; at most {EvidenceLimits.MaxMeasurementsPerIncident} are accepted");
            return measurements.ToImmutable();
        }

        var devices = new HashSet<string>(StringComparer.Ordinal);
        var index = 0;
        foreach (var item in array)
        {
            if (ElementReader.ForItem(item, "measurement", index++, log) is not { } r)
            {
                continue;
            }

            var device = r.RequiredString("device");
            var measurement = new SubstationMeasurement(
                new SwitchId(device ?? string.Empty),
                r.OptionalNumber("phaseCurrentA", NumberRange.AtLeast(0)),
                r.OptionalNumber("residualCurrentA", NumberRange.AtLeast(0)),
                r.OptionalNumber("neutralVoltageV", NumberRange.AtLeast(0)));
            r.WarnUnknownFields();
            if (device is not null && grid is not null && !grid.HasSwitch(measurement.Device))
            {
                r.Error("device", $"refers to unknown switch \"{device}\"");
            }

            if (device is not null && !devices.Add(device))
            {
                r.Error("device", "is listed more than once; give one record per device");
            }

            measurements.Add(measurement);
        }

        return measurements.ToImmutable();
    }

    private static ImmutableArray<Indication> Indications(ElementReader root, Grid? grid, IssueLog log, DateTimeOffset? faultAt) =>
        root.Array("indications", required: true) is { } array ? IndicationItems(array, grid, log, faultAt) : [];

    private static ImmutableArray<Indication> IndicationItems(IEnumerable<JsonElement> array, Grid? grid, IssueLog log, DateTimeOffset? faultAt)
    {
        var indications = ImmutableArray.CreateBuilder<Indication>();
        var seen = new HashSet<string>(StringComparer.Ordinal);
        var index = 0;
        foreach (var item in array)
        {
            if (ElementReader.ForItem(item, "indication", index++, log) is not { } r)
            {
                continue;
            }

            var indicator = r.RequiredString("indicator");
            var label = indicator ?? r.Id;
            var reader = new ElementReader(item, "indication", label, log);
            _ = reader.RequiredString("indicator");
            var state = GridFormat.Choice(reader, "state", IncidentFormat.States);
            var source = GridFormat.Choice(reader, "source", IncidentFormat.Sources);
            var readAt = Time(reader, "readAt", required: false);
            if (readAt is { } read && faultAt is { } began && read < began)
            {
                reader.Error("readAt", $"{Text(read)} is before faultAt {Text(began)}: a reading taken before the fault says nothing of it");
            }
            var suspect = reader.OptionalBool("suspect") ?? false;
            reader.WarnUnknownFields();
            if (indicator is null)
            {
                continue;
            }

            if (grid is not null && !grid.HasIndicator(new IndicatorId(indicator)))
            {
                reader.Error("indicator", $"refers to unknown indicator \"{indicator}\"");
            }
            else if (!seen.Add(indicator))
            {
                reader.Error("indicator", "is listed more than once; give one indication per indicator");
            }
            else if (grid is not null && state is IndicatorState.Forward or IndicatorState.Reverse
                && !grid.Indicator(new IndicatorId(indicator)).Directional)
            {
                reader.Error("state", $"\"{IncidentFormat.Name(state.Value)}\" needs a directional indicator; {indicator} is non-directional");
            }
            else if (grid is not null && state is IndicatorState.Fault && grid.Indicator(new IndicatorId(indicator)).Directional)
            {
                reader.Error("state", $"\"fault\" is not a state of the directional indicator {indicator}: use forward or reverse");
            }

            indications.Add(new Indication(new IndicatorId(indicator), state ?? IndicatorState.Unknown, source ?? IndicationSource.Remote, readAt, suspect));
        }

        return indications.ToImmutable();
    }
}
