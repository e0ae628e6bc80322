using FeederLocate.Application.Incidents;
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
public sealed class EvidenceIntake(IncidentLog log)
{
    /// <summary>Indications: one object or an array of them, as in an incident file's <c>indications</c>.</summary>
    public EvidenceResult AddIndications(IncidentId incident, Grid grid, string json, Actor actor) =>
        Add(incident, grid, actor, IncidentReader.ParseIndications(json, grid), i => new IndicationEntered(i));

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

        log.RecordAll(incident, [.. items.Select(toEvent)], actor, grid);
        return new EvidenceResult(items.Count, read.Issues);
    }
}
