using System.CommandLine;
using System.Globalization;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Evaluation;

namespace FeederLocate.Cli.Commands;

/// <summary><c>evaluate GRID --incidents N --seed S</c>: hit rates of the ranking on simulated incidents.</summary>
internal static class EvaluateCommand
{
    public static Command Create(CliConsole console)
    {
        var grid = CliOptions.Grid();
        var incidents = new Option<int>("--incidents") { Description = "Number of simulated incidents", DefaultValueFactory = _ => 200 };
        var seed = new Option<int>("--seed") { Description = "Seed of the simulation", DefaultValueFactory = _ => 1 };
        var miss = new Option<double>("--miss") { Description = "Probability that an indicator misses a fault", DefaultValueFactory = _ => 0.05 };
        var falseReport = new Option<double>("--false") { Description = "Probability that an indicator reports falsely", DefaultValueFactory = _ => 0.02 };
        var unknown = new Option<double>("--unknown") { Description = "Probability that a report is lost", DefaultValueFactory = _ => 0.10 };
        var learning = new Option<bool>("--learning") { Description = "Replay a simulated history of --incidents outcomes and print the learning curve" };
        var tests = new Option<int>("--test-incidents") { Description = "With --learning: incidents scored at each point of the curve", DefaultValueFactory = _ => 200 };
        var hot = new Option<string?>("--hot-segment") { Description = "With --learning: the segment that fails --hot-factor times as often as nominal" };
        var noisy = new Option<string?>("--noisy-indicator") { Description = "With --learning: the indicator that reports falsely with probability --noisy-false" };
        var hotFactor = new Option<double>("--hot-factor") { Description = "With --learning: how many times its line type's rate the hot segment fails", DefaultValueFactory = _ => 5 };
        var noisyFalse = new Option<double>("--noisy-false") { Description = "With --learning: the noisy indicator's probability of reporting falsely", DefaultValueFactory = _ => 0.5 };
        var fixedStrengths = new Option<bool>("--fixed-strengths") { Description = "With --learning: hold the priors at their configured strengths instead of choosing them by the data (for comparison)" };
        var protection = new Option<bool>("--protection") { Description = "Incidents carry the protection context (relay directions at every feeder breaker, reclosing, fuses, fault locator); report hit rates without and with it" };
        var highResistance = new Option<double>("--high-resistance") { Description = "With --protection: share of earth faults on solid and impedance grids through 200 Ω to 5 kΩ that trip nothing", DefaultValueFactory = _ => 0.3 };
        var json = CliOptions.Json();
        var command = new Command("evaluate", "Simulate incidents with the reference model and score the ranking against the truth and a baseline rule; with --learning, the learning curve")
        {
            grid, incidents, seed, miss, falseReport, unknown, learning, tests, hot, noisy, hotFactor, noisyFalse, fixedStrengths, protection, highResistance, json,
        };
        command.SetAction(parse => parse.GetValue(learning)
            ? EvaluateLearning.Run(console, InputFiles.LoadGrid(parse.GetValue(grid)!, console.Error), Math.Max(1, parse.GetValue(incidents)),
                Math.Max(1, parse.GetValue(tests)), parse.GetValue(seed),
                new LearningDefects(parse.GetValue(hot), parse.GetValue(noisy), parse.GetValue(hotFactor), parse.GetValue(noisyFalse)), parse.GetValue(fixedStrengths), parse.GetValue(json))
            : parse.GetValue(protection)
            ? RunProtection(console, parse.GetValue(grid)!, parse.GetValue(incidents), parse.GetValue(seed),
                new SimulationSettings(parse.GetValue(miss), parse.GetValue(falseReport), parse.GetValue(unknown)) { HighResistanceShare = parse.GetValue(highResistance) },
                parse.GetValue(json))
            : Run(console, parse.GetValue(grid)!, parse.GetValue(incidents), parse.GetValue(seed),
                new SimulationSettings(parse.GetValue(miss), parse.GetValue(falseReport), parse.GetValue(unknown)), parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string gridPath, int incidents, int seed, SimulationSettings settings, bool json)
    {
        if (incidents < 1)
        {
            throw new BadInputException($"error: --incidents must be >= 1, got {incidents}");
        }

        try
        {
            settings.Validate();
        }
        catch (ArgumentOutOfRangeException e)
        {
            throw new BadInputException($"error: {e.Message.Split(Environment.NewLine)[0]}");
        }

        var grid = InputFiles.LoadGrid(gridPath, console.Error);
        var report = ProgressDisplay.Run(console, "evaluate", progress =>
            RankingEvaluation.Run(grid, incidents, seed, settings, TimeProvider.System, progress: progress));
        var document = new EvaluationDocument(
            report.Deployed.SegmentTop1, report.Deployed.SegmentTop3,
            new Rates(report.Limit.SegmentTop1, report.Limit.SegmentTop3),
            new Rates(report.Baseline.SegmentTop1, report.Baseline.SegmentTop3),
            report.MillisecondsPerIncident,
            new SectionRates(report.Deployed.SectionTop1, report.Deployed.SectionTop3, report.Limit.SectionTop1, report.Limit.SectionTop3,
                report.Baseline.SectionTop1, report.Baseline.SectionTop3),
            report.Incidents);
        if (json)
        {
            JsonOutput.Write(console.Out, document);
            return CliApp.Success;
        }

        console.Out.WriteLine($"{grid.Name}: {incidents} simulated incidents, seed {seed}, miss {P(settings.MissProbability)}, false {P(settings.FalseProbability)}, unknown {P(settings.UnknownProbability)}");
        var table = TableOutput.Table("ranking", "section top-1", "section top-3", "segment top-1", "segment top-3");
        table.AddRow("as deployed", P(report.Deployed.SectionTop1), P(report.Deployed.SectionTop3), P(report.Deployed.SegmentTop1), P(report.Deployed.SegmentTop3));
        table.AddRow("told the true error rates", P(report.Limit.SectionTop1), P(report.Limit.SectionTop3), P(report.Limit.SegmentTop1), P(report.Limit.SegmentTop3));
        table.AddRow("baseline: just beyond the last indicator that saw it", P(report.Baseline.SectionTop1), P(report.Baseline.SectionTop3), P(report.Baseline.SegmentTop1), P(report.Baseline.SegmentTop3));
        TableOutput.Write(console.Out, table);
        console.Out.WriteLine($"ranking time {report.MillisecondsPerIncident.ToString("F1", CultureInfo.InvariantCulture)} ms per incident");
        return CliApp.Success;
    }

    private static int RunProtection(CliConsole console, string gridPath, int incidents, int seed, SimulationSettings settings, bool json)
    {
        if (incidents < 1)
        {
            throw new BadInputException($"error: --incidents must be >= 1, got {incidents}");
        }

        try
        {
            settings.Validate();
        }
        catch (ArgumentOutOfRangeException e)
        {
            throw new BadInputException($"error: {e.Message.Split(Environment.NewLine)[0]}");
        }

        var grid = InputFiles.LoadGrid(gridPath, console.Error);
        var report = ProgressDisplay.Run(console, "evaluate", progress =>
            ProtectionEvaluation.Run(grid, incidents, seed, settings, TimeProvider.System, progress: progress));
        static HitRateDocument Of(HitRates r) => new(r.SectionTop1, r.SectionTop3, r.SegmentTop1, r.SegmentTop3);
        if (json)
        {
            JsonOutput.Write(console.Out, new ProtectionDocument(
                report.With.SegmentTop1, report.With.SegmentTop3, Of(report.Without), Of(report.With), report.MillisecondsPerIncident, report.Incidents, settings.HighResistanceShare));
            return CliApp.Success;
        }

        console.Out.WriteLine($"{grid.Name}: {incidents} simulated incidents with protection context, seed {seed}, miss {P(settings.MissProbability)}, false {P(settings.FalseProbability)}, unknown {P(settings.UnknownProbability)}, high-resistance earth faults {P(settings.HighResistanceShare)} (solid and impedance)");
        var table = TableOutput.Table("ranking", "section top-1", "section top-3", "segment top-1", "segment top-3");
        table.AddRow("without the protection context", P(report.Without.SectionTop1), P(report.Without.SectionTop3), P(report.Without.SegmentTop1), P(report.Without.SegmentTop3));
        table.AddRow("with the protection context", P(report.With.SectionTop1), P(report.With.SectionTop3), P(report.With.SegmentTop1), P(report.With.SegmentTop3));
        TableOutput.Write(console.Out, table);
        console.Out.WriteLine($"ranking time {report.MillisecondsPerIncident.ToString("F1", CultureInfo.InvariantCulture)} ms per incident");
        return CliApp.Success;
    }

    private static string P(double p) => (p * 100).ToString("F1", CultureInfo.InvariantCulture) + " %";

    /// <summary>The contract's fields (segment hit rates) first; section hit rates beside them.</summary>
    internal sealed record EvaluationDocument(double Top1, double Top3, Rates Limit, Rates Baseline, double MsPerIncident, SectionRates Sections, int Incidents);

    internal sealed record Rates(double Top1, double Top3);

    internal sealed record HitRateDocument(double SectionTop1, double SectionTop3, double SegmentTop1, double SegmentTop3);

    /// <summary>With --protection: top1/top3 are the segment hit rates with the context; both sides in full beside them.</summary>
    internal sealed record ProtectionDocument(double Top1, double Top3, HitRateDocument WithoutProtection, HitRateDocument WithProtection, double MsPerIncident, int Incidents, double HighResistanceShare);

    internal sealed record SectionRates(double Top1, double Top3, double LimitTop1, double LimitTop3, double BaselineTop1, double BaselineTop3);
}
