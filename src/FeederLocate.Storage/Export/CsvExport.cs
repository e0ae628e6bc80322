using FeederLocate.Core.Formats;
using FeederLocate.Core.Learning;
using FeederLocate.Storage.Database;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Export;

/// <summary>Tables for a spreadsheet: the incident list and per-indicator statistics, as RFC 4180 CSV with a header row.</summary>
public static class CsvExport
{
    /// <summary>Columns of <see cref="WriteIncidents"/>.</summary>
    public static IReadOnlyList<string> IncidentColumns { get; } =
        ["id", "grid", "reportedAt", "status", "faultType", "confirmedSegment", "cause", "notes", "events"];

    /// <summary>Columns of <see cref="WriteIndicatorStatistics"/>; probabilities 0..1, intervals 90 % equal-tailed.</summary>
    public static IReadOnlyList<string> IndicatorColumns { get; } =
    [
        "indicator", "directional", "remote",
        "missTrials", "misses", "missProbability", "missLower90", "missUpper90",
        "falseReportTrials", "falseReports", "falseReportProbability", "falseReportLower90", "falseReportUpper90",
    ];

    /// <summary>One row per incident: times ISO 8601 UTC, status open or closed, fault type as in the incident format.</summary>
    public static void WriteIncidents(IEnumerable<IncidentSummary> incidents, TextWriter writer)
    {
        ArgumentNullException.ThrowIfNull(incidents);
        ArgumentNullException.ThrowIfNull(writer);
        Csv.WriteRow(writer, IncidentColumns);
        foreach (var i in incidents)
        {
            Csv.WriteRow(writer,
            [
                i.Id.ToString(),
                i.GridName,
                IsoTime.Format(i.ReportedAt),
                i.Status == IncidentStatus.Open ? "open" : "closed",
                IncidentFormat.Name(i.FaultType),
                i.ConfirmedSegment?.Value,
                i.Cause,
                i.Notes,
                Csv.Number(i.EventCount),
            ]);
        }
    }

    /// <summary>One row per indicator of the learned grid, in grid order.</summary>
    public static void WriteIndicatorStatistics(IndicatorReliabilityEstimate reliabilities, TextWriter writer)
    {
        ArgumentNullException.ThrowIfNull(reliabilities);
        ArgumentNullException.ThrowIfNull(writer);
        Csv.WriteRow(writer, IndicatorColumns);
        foreach (var r in reliabilities.Indicators)
        {
            var miss = r.MissInterval90;
            var falseReport = r.FalseReportInterval90;
            Csv.WriteRow(writer,
            [
                r.Indicator.Value,
                r.Kind.Directional ? "true" : "false",
                r.Kind.Remote ? "true" : "false",
                Csv.Number(r.Counts.MissTrials),
                Csv.Number(r.Counts.Misses),
                Csv.Number(r.MissProbability),
                Csv.Number(miss.Lower),
                Csv.Number(miss.Upper),
                Csv.Number(r.Counts.FalseReportTrials),
                Csv.Number(r.Counts.FalseReports),
                Csv.Number(r.FalseReportProbability),
                Csv.Number(falseReport.Lower),
                Csv.Number(falseReport.Upper),
            ]);
        }
    }
}
