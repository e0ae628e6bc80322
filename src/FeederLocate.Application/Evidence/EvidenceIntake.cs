using System.Text.Json;
using FeederLocate.Application.Incidents;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Evidence;

/// <summary>What came of evidence handed in as text: how many items were logged, or every problem found (then none was).</summary>
public sealed record EvidenceResult(int Accepted, IReadOnlyList<ValidationIssue> Issues)
{
    public bool IsAccepted => !Issues.Any(i => i.Severity == Severity.Error);
}

/// <summary>
/// Evidence for a logged incident given as JSON in the incident format's own shapes (one item or an array): read
/// by the incident reader, with its messages, checked against the incident's grid, and logged all or none.
/// </summary>
public sealed class EvidenceIntake(IncidentLog log, TimeProvider? clock = null)
{
    private readonly TimeProvider _clock = clock ?? TimeProvider.System;

    /// <summary>
    /// Indications: one object or an array of them, as in an incident file's <c>indications</c>. An item that
    /// does not mention <c>suspect</c> keeps the operator's distrust mark on its indicator as it stands; only an
    /// explicit <c>"suspect": false</c> clears it.
    /// </summary>
    public EvidenceResult AddIndications(IncidentId incident, Grid grid, string json, Actor actor)
    {
        var read = IncidentReader.ParseIndications(json, grid, log.State(incident).Incident.FaultAt);
        if (read.Value is not { } items)
        {
            return Add(incident, grid, actor, read, i => new IndicationEntered(i));
        }

        var state = log.State(incident);
        var now = _clock.GetUtcNow();
        var late = items
            .Select(i => i.ReadAt is { } at && Times.EventTimes.Problem("readAt", at, state, now) is { } problem
                ? new ValidationIssue(Severity.Error, "indication", i.Indicator.Value, "readAt", problem["readAt ".Length..])
                : null)
            .OfType<ValidationIssue>()
            .ToList();
        if (late.Count > 0)
        {
            return new EvidenceResult(0, [.. read.Issues, .. late]);
        }

        var silent = WithoutDistrustField(json);
        var marked = state.Incident.Indications.Where(i => i.Distrusted).Select(i => i.Indicator).ToHashSet();
        return Add(incident, grid, actor, read, i =>
            new IndicationEntered(silent.Contains(i.Indicator.Value) && marked.Contains(i.Indicator) ? i with { Distrusted = true } : i));
    }

    /// <summary>
    /// One reading entered on a page (the desk or the field page), its time as given: refused with the reason when
    /// that time is in the future or before the fault began; else logged. Null when logged.
    /// </summary>
    public string? Enter(IncidentId incident, Grid grid, Indication indication, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(indication);
        var state = log.State(incident);
        if (indication.ReadAt is { } at && Times.EventTimes.Problem($"the reading of {indication.Indicator} at", at, state, _clock.GetUtcNow()) is { } problem)
        {
            return problem;
        }

        log.Append(incident, new IndicationEntered(indication), actor, grid);
        return null;
    }

    /// <summary>The indicators of the items (already read without errors) that do not mention <c>suspect</c>.</summary>
    private static HashSet<string> WithoutDistrustField(string json)
    {
        using var document = JsonDocument.Parse(json, Core.Formats.ReaderJson.DocumentOptions);
        var items = document.RootElement.ValueKind == JsonValueKind.Array ? document.RootElement.EnumerateArray().ToList() : [document.RootElement];
        return [.. items
            .Where(item => !item.TryGetProperty("suspect", out _) && item.TryGetProperty("indicator", out var id) && id.ValueKind == JsonValueKind.String)
            .Select(item => item.GetProperty("indicator").GetString()!)];
    }

    /// <summary>Substation measurements: one object or an array, as in an incident file's <c>measurements</c>.</summary>
    public EvidenceResult AddMeasurements(IncidentId incident, Grid grid, string json, Actor actor) =>
        Add(incident, grid, actor, IncidentReader.ParseMeasurements(json, grid), m => new MeasurementRecorded(m));

    private EvidenceResult Add<T>(IncidentId incident, Grid grid, Actor actor, LoadResult<IReadOnlyList<T>> read, Func<T, IncidentEvent> toEvent)
    {
        ArgumentNullException.ThrowIfNull(grid);
        if (read.Value is not { } items)
        {
            return new EvidenceResult(0, read.Issues);
        }

        log.AppendAll(incident, [.. items.Select(toEvent)], actor, grid);
        return new EvidenceResult(items.Count, read.Issues);
    }
}
