using System.CommandLine;
using System.Globalization;
using FeederLocate.Application.Naming;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Application.History;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Export;

namespace FeederLocate.Cli.Commands;

/// <summary>
/// The history database's commands: <c>history</c> (logged incidents), <c>stats</c> (what has been
/// learned for a grid), <c>export</c> (CSV), <c>backup</c> (online copy) and <c>integrity</c>.
/// </summary>
internal static class HistoryCommands
{
    public static IEnumerable<Command> Create(CliConsole console)
    {
        yield return History(console);
        yield return Stats(console);
        yield return Export(console);
        yield return Backup(console);
        yield return Integrity(console);
    }

    private static Command History(CliConsole console)
    {
        var db = CliOptions.Database(required: true);
        var json = CliOptions.Json();
        var grids = new Option<string[]>("--grid")
        {
            Description = "Grid files (feederlocate-grid/1) whose incidents' confirmed segments the text names by feeder and bounding devices (the JSON keeps the ids)",
            AllowMultipleArgumentsPerToken = false,
        };
        var command = new Command("history", "List the incidents in the history database") { db, json, grids };
        command.SetAction(parse =>
        {
            var names = (parse.GetValue(grids) ?? [])
                .Select(p => new NetworkGraph(InputFiles.LoadGrid(p, console.Error)))
                .GroupBy(g => g.Grid.Name, StringComparer.Ordinal)
                .ToDictionary(g => g.Key, g => GridNames.Segments(g.Last()), StringComparer.Ordinal);
            using var log = HistoryDatabase.OpenExistingLog(parse.GetValue(db)!);
            var incidents = log.List().OrderBy(i => i.Id.Value).ToList();
            if (parse.GetValue(json))
            {
                JsonOutput.Write(console.Out, incidents.Select(i => new
                {
                    id = i.Id.Value, grid = i.GridName, reportedAt = i.ReportedAt, status = i.Status.ToString(),
                    faultType = i.FaultType?.ToString(), confirmedSegment = i.ConfirmedSegment?.Value, noFaultFound = i.NoFaultFound, transient = i.Transient, cause = i.Cause, events = i.EventCount,
                }));
                return CliApp.Success;
            }

            var table = TableOutput.Table("id", "grid", "reported", "status", "type", "confirmed segment", "cause", "events");
            foreach (var i in incidents)
            {
                table.AddRow(i.Id.ToString(), i.GridName, i.ReportedAt.ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture), i.Status.ToString(),
                    i.FaultType?.ToString() ?? "unknown", i.ConfirmedSegment is { } confirmed ? Confirmed(confirmed, names.GetValueOrDefault(i.GridName)) : (i.NoFaultFound ? (i.Transient ? "none found (transient)" : "none found") : "–"), i.Cause ?? string.Empty, i.EventCount.ToString(CultureInfo.InvariantCulture));
            }

            TableOutput.Write(console.Out, table);
            return CliApp.Success;
        });
        return command;
    }

    /// <summary>A confirmed segment in the text: its name and id where its grid was given, else its id.</summary>
    private static string Confirmed(FeederLocate.Core.Model.SegmentId segment, SegmentNames? names) =>
        names is not null && names.All.ContainsKey(segment) ? $"{names[segment]} ({segment})" : segment.Value;

    private static Command Stats(CliConsole console)
    {
        var grid = CliOptions.Grid();
        var db = CliOptions.Database(required: true);
        var json = CliOptions.Json();
        var command = new Command("stats", "Learned fault rates and indicator reliabilities for a grid, from the recorded outcomes") { grid, db, json };
        command.SetAction(parse =>
        {
            var model = InputFiles.LoadGrid(parse.GetValue(grid)!, console.Error);
            using var log = HistoryDatabase.OpenExistingLog(parse.GetValue(db)!);
            var graph = new NetworkGraph(model);
            var learning = new GridLearning(log);
            var outcomes = learning.OutcomesForLearning(graph);
            var learned = learning.Learned(graph);
            var unusable = learning.Unusable(graph);
            var segments = learned.FaultRates.Segments.OrderByDescending(s => s.Faults).ThenByDescending(s => s.FaultsPerKmYear).ToList();
            var indicators = learned.Indicators.Indicators.OrderByDescending(i => i.FalseReportProbability + i.MissProbability).ToList();
            if (parse.GetValue(json))
            {
                JsonOutput.Write(console.Out, new
                {
                    grid = model.Name,
                    outcomes = outcomes.Count,
                    notLearnedFrom = unusable.Select(u => new { incidentId = u.Incident.Value, confirmedSegment = u.ConfirmedSegment.Value, problem = u.Problem }),
                    observationYears = learned.FaultRates.ObservationYears,
                    lineTypes = learned.FaultRates.LineTypes.Select(t => new
                    {
                        id = t.LineType.Value,
                        statedFaultsPer100KmYear = model.LineTypes.Single(l => l.Id == t.LineType).EffectiveFaultsPer100KmYear,
                        faults = t.Faults,
                        exposureKmYears = t.ExposureKmYears,
                        prior = PriorJson(t.Choice!),
                    }),
                    indicatorKinds = learned.Indicators.Kinds.Select(k => new
                    {
                        kind = k.Kind.ToString(),
                        indicators = k.Indicators,
                        miss = ReliabilityJson(k.MissChoice!),
                        falseReport = ReliabilityJson(k.FalseReportChoice!),
                        wrongDirection = k.WrongDirectionChoice is { } w ? ReliabilityJson(w) : null,
                    }),
                    segments = segments.Select(s => new { id = s.Segment.Value, faults = s.Faults, faultsPer100KmYear = s.FaultsPer100KmYear, expectedFaultsPerYear = s.ExpectedFaultsPerYear }),
                    indicators = indicators.Select(i => new
                    {
                        id = i.Indicator.Value, missProbability = i.MissProbability, falseReportProbability = i.FalseReportProbability,
                        wrongDirectionProbability = i.WrongDirectionProbability,
                        counts = i.Counts,
                    }),
                    recordRatios = learned.RecordRatios.Where(r => r.Records > 0).Select(r => new
                    {
                        quantity = r.Quantity, records = r.Records, geometricMeanRatio = r.GeometricMeanRatio,
                        logRatioStandardDeviation = double.IsFinite(r.LogRatioStandardDeviation) ? r.LogRatioStandardDeviation : (double?)null,
                        relativeError = double.IsFinite(r.RelativeError) ? r.RelativeError : (double?)null,
                    }),
                    skipped = learned.Skipped.Select(s => new { reportedAt = s.ReportedAt, segment = s.Segment.Value, reason = s.Reason }),
                });
                return CliApp.Success;
            }

            var invariant = CultureInfo.InvariantCulture;
            var segmentNames = GridNames.Segments(graph);
            console.Out.WriteLine($"{model.Name}: {outcomes.Count} recorded outcomes over {learned.FaultRates.ObservationYears.ToString("F2", invariant)} years");
            var types = TableOutput.Table("line type", "stated faults/100 km·year", "faults", "km·years", "type rate faults/100 km·year", "prior strength km·years", "chosen");
            foreach (var t in learned.FaultRates.LineTypes)
            {
                var c = t.Choice!;
                types.AddRow(t.LineType.Value, model.LineTypes.Single(l => l.Id == t.LineType).EffectiveFaultsPer100KmYear.ToString("F2", invariant),
                    t.Faults.ToString(invariant), t.ExposureKmYears.ToString("#,0", invariant), c.MeanPer100KmYear.ToString("F2", invariant),
                    Figures.Significant(c.StrengthKmYears), Chosen(c.ChosenByData, c.AtBound, c.LowerKmYears, c.UpperKmYears));
            }

            TableOutput.Write(console.Out, types);
            var kinds = TableOutput.Table("indicator kind", "rate", "kind rate", "prior strength trials", "chosen");
            foreach (var k in learned.Indicators.Kinds)
            {
                foreach (var (name, c) in new[] { ("miss", k.MissChoice), ("false report", k.FalseReportChoice), ("wrong direction", k.WrongDirectionChoice) })
                {
                    if (c is not null)
                    {
                        kinds.AddRow(k.Kind.ToString(), name, c.Mean.ToString("P1", invariant), Figures.Significant(c.StrengthTrials),
                            Chosen(c.ChosenByData, c.AtBound, c.LowerTrials, c.UpperTrials));
                    }
                }
            }

            TableOutput.Write(console.Out, kinds);
            foreach (var u in unusable)
            {
                console.Out.WriteLine($"not learned from: incident {u.Incident}, outcome on {segmentNames[u.ConfirmedSegment]} ({u.ConfirmedSegment}): {u.Problem}");
            }

            var seg = TableOutput.Table("segment", "id", "faults", "learned faults/100 km·year", "expected faults/year");
            foreach (var s in segments.Take(15))
            {
                seg.AddRow(segmentNames[s.Segment], s.Segment.Value, s.Faults.ToString(invariant), s.FaultsPer100KmYear.ToString("F2", invariant), s.ExpectedFaultsPerYear.ToString("F4", invariant));
            }

            TableOutput.Write(console.Out, seg);
            var ind = TableOutput.Table("indicator", "P(miss)", "P(false report)", "P(wrong direction)");
            foreach (var i in indicators)
            {
                ind.AddRow(i.Indicator.Value, i.MissProbability.ToString("P1", invariant), i.FalseReportProbability.ToString("P1", invariant),
                    i.WrongDirectionProbability?.ToString("P1", invariant) ?? "–");
            }

            TableOutput.Write(console.Out, ind);
            foreach (var r in learned.RecordRatios.Where(r => r.Records > 0))
            {
                console.Out.WriteLine($"{r.Quantity} recorded / predicted at the confirmed faults: {r.GeometricMeanRatio.ToString("F3", invariant)} (geometric mean of {r.Records.ToString(invariant)}, spread of ln ratio {(double.IsFinite(r.LogRatioStandardDeviation) ? r.LogRatioStandardDeviation.ToString("F3", invariant) : "–")}); learned relative error {(double.IsFinite(r.RelativeError) ? r.RelativeError.ToString("P1", invariant) : $"– (fewer than {RecordRatio.MinimumRecords.ToString(invariant)})")}, the ranking's tolerance where larger");
            }

            foreach (var s in learned.Skipped)
            {
                console.Out.WriteLine($"skipped the outcome reported {s.ReportedAt.ToString("yyyy-MM-dd HH:mm", invariant)} on {segmentNames[s.Segment]} ({s.Segment}): {s.Reason}");
            }
            return CliApp.Success;
        });
        return command;
    }

    private static object PriorJson(FeederLocate.Core.Learning.PriorChoice.FaultRatePriorChoice c) => new
    {
        faultsPer100KmYear = c.MeanPer100KmYear, strengthKmYears = c.StrengthKmYears, chosenByData = c.ChosenByData, atBound = c.AtBound,
        boundsKmYears = new[] { c.LowerKmYears, c.UpperKmYears },
    };

    private static object ReliabilityJson(FeederLocate.Core.Learning.PriorChoice.ReliabilityPriorChoice c) => new
    {
        probability = c.Mean, strengthTrials = c.StrengthTrials, chosenByData = c.ChosenByData, atBound = c.AtBound,
        boundsTrials = new[] { c.LowerTrials, c.UpperTrials },
    };

    private static string Chosen(bool byData, bool atBound, double lower, double upper) =>
        !byData ? "configured (no history)"
        : atBound ? $"by data, on a bound of {Figures.Significant(lower)}–{Figures.Significant(upper)}"
        : $"by data, within {Figures.Significant(lower)}–{Figures.Significant(upper)}";

    private static Command Export(CliConsole console)
    {
        var db = CliOptions.Database(required: true);
        var what = new Option<string>("--what") { Description = "incidents, or indicators (needs --grid)", DefaultValueFactory = _ => "incidents" };
        var grid = new Option<string?>("--grid") { Description = "Grid file, for indicator statistics" };
        var output = new Option<string?>("--output", "-o") { Description = "CSV file to write (default: stdout)" };
        var command = new Command("export", "Export incidents or indicator statistics as CSV") { db, what, grid, output };
        command.SetAction(parse =>
        {
            using var log = HistoryDatabase.OpenExistingLog(parse.GetValue(db)!);
            var text = new StringWriter(CultureInfo.InvariantCulture);
            switch (parse.GetValue(what))
            {
                case "incidents":
                    CsvExport.WriteIncidents([.. log.List().OrderBy(i => i.Id.Value)], text);
                    break;
                case "indicators":
                    var gridPath = parse.GetValue(grid) ?? throw new BadInputException("error: --what indicators needs --grid GRID");
                    var model = InputFiles.LoadGrid(gridPath, console.Error);
                    CsvExport.WriteIndicatorStatistics(new GridLearning(log).Learned(new NetworkGraph(model)).Indicators, text);

                    break;
                default:
                    throw new BadInputException($"error: --what must be incidents or indicators, got \"{parse.GetValue(what)}\"");
            }

            if (parse.GetValue(output) is { } path)
            {
                OutputFiles.WriteWhole(path, text.ToString());
            }
            else
            {
                console.Out.Write(text.ToString());
            }

            return CliApp.Success;
        });
        return command;
    }

    private static Command Backup(CliConsole console)
    {
        var db = CliOptions.Database(required: true);
        var output = new Option<string>("--output", "-o") { Description = "The backup file to write", Required = true };
        var command = new Command("backup", "Copy the history database online to a file (SQLite online backup)") { db, output };
        command.SetAction(parse =>
        {
            using var store = ExistingDatabase.Open(parse.GetValue(db)!);
            store.BackupTo(parse.GetValue(output)!);
            console.Out.WriteLine($"backed up {parse.GetValue(db)} to {parse.GetValue(output)}");
            return CliApp.Success;
        });
        return command;
    }

    private static Command Integrity(CliConsole console)
    {
        var db = CliOptions.Database(required: true);
        var json = CliOptions.Json();
        var command = new Command("integrity", "Check the history database's integrity (exit 1 when it fails)") { db, json };
        command.SetAction(parse =>
        {
            using var store = ExistingDatabase.Open(parse.GetValue(db)!);
            var report = store.CheckIntegrity();
            if (parse.GetValue(json))
            {
                JsonOutput.Write(console.Out, report);
            }
            else
            {
                console.Out.WriteLine(report.ToString());
            }

            return report.IsOk ? CliApp.Success : CliApp.InternalFailure;
        });
        return command;
    }
}
