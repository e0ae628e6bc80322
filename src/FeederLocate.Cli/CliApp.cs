using System.CommandLine;
using FeederLocate.Cli.Commands;
using FeederLocate.Cli.Input;
using FeederLocate.Core.Formats;
using FeederLocate.Storage.Errors;

namespace FeederLocate.Cli;

/// <summary>
/// The <c>feederlocate</c> command line. Exit codes: 0 success, 2 bad input (every error on stderr,
/// nothing written), 1 internal failure.
/// </summary>
public static class CliApp
{
    public const int Success = 0;
    public const int InternalFailure = 1;
    public const int BadInput = 2;

    public static int Run(string[] args, TextWriter output, TextWriter error)
    {
        ArgumentNullException.ThrowIfNull(args);
        var console = new CliConsole(output, error);
        var root = new RootCommand("FeederLocate: find the faulted section of a radial MV feeder, and check grid files.")
        {
            CheckCommand.Create(console),
            FaultCommand.Create(console),
            RankCommand.Create(console),
            PlanCommand.Create(console),
            EvaluateCommand.Create(console),
            RecordCommand.Create(console),
            RetractCommand.Create(console),
            SwitchesCommand.Create(console),
            SwitchingCommand.Create(console),
            LifecycleCommand.Create(console),
            HandoverCommand.Create(console),
            GenerateCommand.Create(console),
            BenchCommand.Create(console),
        };

        foreach (var command in HistoryCommands.Create(console).Concat(GridCommands.Create(console)))
        {
            root.Subcommands.Add(command);
        }

        var parsed = root.Parse(args);
        if (parsed.Errors.Count > 0)
        {
            foreach (var parseError in parsed.Errors)
            {
                error.WriteLine($"error: {parseError.Message}");
            }

            error.WriteLine("Run 'feederlocate --help' for the commands and their options.");
            return BadInput;
        }

        try
        {
            return parsed.Invoke(new InvocationConfiguration { Output = output, Error = error, EnableDefaultExceptionHandler = false });
        }
        catch (BadInputException e)
        {
            foreach (var line in e.Lines)
            {
                error.WriteLine(line);
            }

            return BadInput;
        }
        catch (Exception e) when (e is IncidentStoreException or DatabaseMissingException)
        {
            error.WriteLine($"error: {e.Message}");
            return BadInput;
        }
        catch (GridDataException e)
        {
            foreach (var issue in e.Errors)
            {
                error.WriteLine($"error: {issue}");
            }

            return BadInput;
        }
#pragma warning disable CA1031 // The command line's last line of defence: report, exit 1.
        catch (Exception e)
#pragma warning restore CA1031
        {
            error.WriteLine($"internal error: {e.GetType().Name}: {e.Message}");
            return InternalFailure;
        }
    }
}
