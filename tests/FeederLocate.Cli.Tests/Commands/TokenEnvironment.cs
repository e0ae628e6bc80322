namespace FeederLocate.Cli.Tests.Commands;

/// <summary>
/// The tests that set the process's FEEDERLOCATE_TOKEN (the command line runs in this process) run one at a time,
/// so one test's token never reaches another's command.
/// </summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class TokenEnvironment
{
    public const string Name = "token environment";

    /// <summary>Runs the command line with <paramref name="token"/> in FEEDERLOCATE_TOKEN, then clears it.</summary>
    public static CliRun Run(string? token, string[] args) => Run(token, () => CliRun.Of(args));

    /// <summary>Runs <paramref name="run"/> with <paramref name="token"/> in FEEDERLOCATE_TOKEN, then clears it.</summary>
    public static CliRun Run(string? token, Func<CliRun> run)
    {
        Environment.SetEnvironmentVariable("FEEDERLOCATE_TOKEN", token);
        try
        {
            return run();
        }
        finally
        {
            Environment.SetEnvironmentVariable("FEEDERLOCATE_TOKEN", null);
        }
    }
}
