using FeederLocate.Core.Formats;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Lifecycle;

/// <summary>The shift handover as one JSON document: the same for the HTTP interface and the command line.</summary>
public sealed record HandoverDocument(DateTimeOffset At, IReadOnlyList<HandoverIncident> Incidents, IReadOnlyList<long> IncidentsOnGridsNotLoaded)
{
    public static HandoverDocument From(DateTimeOffset at, IReadOnlyList<HandoverEntry> entries, IReadOnlyList<IncidentSummary> withoutGrid)
    {
        ArgumentNullException.ThrowIfNull(entries);
        ArgumentNullException.ThrowIfNull(withoutGrid);
        return new(at, [.. entries.Select(HandoverIncident.From)], [.. withoutGrid.Select(s => s.Id.Value)]);
    }
}

/// <summary>One open incident of the handover; minutes rounded to one decimal.</summary>
public sealed record HandoverIncident(
    long Id,
    string Grid,
    string Stage,
    double AgeMinutes,
    int? CustomersOff,
    IReadOnlyList<HandoverSection> SectionsOff,
    string? NextStep,
    double CustomerMinutesInterrupted,
    string CustomerMinutesBasis,
    IReadOnlyList<string> UnreadIndicators,
    IReadOnlyList<string> DistrustedIndicators,
    IReadOnlyList<string> ExpiredIndicators,
    string? AnalysisProblem)
{
    /// <summary>Switches probably in the other position than recorded, most probable first.</summary>
    public IReadOnlyList<HandoverSwitchSuspect> SwitchSuspects { get; init; } = [];

    /// <summary>
    /// <see cref="NextStep"/> as people read it (plain words, sections by name) for the page and the command line's
    /// text; the JSON keeps <see cref="NextStep"/> with its ids.
    /// </summary>
    [System.Text.Json.Serialization.JsonIgnore]
    public string? NextStepInWords { get; init; }

    public static HandoverIncident From(HandoverEntry entry)
    {
        ArgumentNullException.ThrowIfNull(entry);
        var line = entry.Line;
        return new(
            entry.Id.Value,
            entry.GridName,
            IncidentStages.Name(line.Stage),
            Math.Round(line.Age.TotalMinutes, 1),
            line.CustomersOff,
            [.. entry.SectionsOff.Select(s => new HandoverSection(s.Id.Value, s.Name, s.Customers))],
            line.CurrentStep,
            Math.Round(line.Interruption?.CustomerMinutesInterrupted ?? 0, 1),
            line.Interruption?.Basis ?? string.Empty,
            [.. entry.Unread.Select(i => i.Value)],
            [.. entry.Distrusted.Select(i => i.Value)],
            [.. entry.Expired.Select(i => i.Value)],
            entry.AnalysisProblem)
        {
            SwitchSuspects = [.. entry.SwitchSuspects.Select(s => new HandoverSwitchSuspect(s.Device.Value, IncidentFormat.Name(s.State), s.Probability))],
            NextStepInWords = line.CurrentStepInWords,
        };
    }
}

/// <summary>A switch probably in <paramref name="State"/> ("open" or "closed") rather than as recorded, with its probability.</summary>
public sealed record HandoverSwitchSuspect(string Device, string State, double Probability);

/// <summary>A section without supply: its id, the name operators use, its customers.</summary>
public sealed record HandoverSection(string Id, string Name, int Customers);
