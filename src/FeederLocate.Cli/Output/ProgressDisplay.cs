using Spectre.Console;

namespace FeederLocate.Cli.Output;

/// <summary>
/// Shows progress of long work on stderr: a live bar on a terminal, otherwise a line at each quarter,
/// so stdout stays clean for <c>--json</c>.
/// </summary>
public static class ProgressDisplay
{
    public static T Run<T>(CliConsole console, string title, Func<IProgress<double>, T> work)
    {
        ArgumentNullException.ThrowIfNull(console);
        if (console.ErrorIsTerminal)
        {
            var ansi = AnsiConsole.Create(new AnsiConsoleSettings { Out = new AnsiConsoleOutput(Console.Error) });
            return ansi.Progress().AutoClear(true).Start(ctx =>
            {
                var task = ctx.AddTask(Markup.Escape(title), maxValue: 1.0);
                return work(new Progress<double>(fraction => task.Value = fraction));
            });
        }

        var lastQuarter = 0;
        var result = work(new SynchronousProgress(fraction =>
        {
            var quarter = (int)Math.Floor(fraction * 4);
            if (quarter > lastQuarter)
            {
                lastQuarter = quarter;
                console.Error.WriteLine($"{title}: {quarter * 25} %");
            }
        }));
        return result;
    }

    /// <summary>Reports on the calling thread, in order (Progress&lt;T&gt; posts to the thread pool).</summary>
    private sealed class SynchronousProgress(Action<double> report) : IProgress<double>
    {
        public void Report(double value) => report(value);
    }
}
