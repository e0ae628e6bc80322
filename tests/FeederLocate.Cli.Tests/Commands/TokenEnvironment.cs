namespace FeederLocate.Cli.Tests.Commands;

/// <summary>
/// The tests that set the process's FEEDERLOCATE_TOKEN (the command line runs in this process) run one at a time,
/// so one test's token never reaches another's command.
/// </summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class TokenEnvironment
{
    public const string Name = "token environment";
}
