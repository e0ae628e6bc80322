namespace FeederLocate.Cli;

/// <summary>Where a command writes: results to <see cref="Out"/>, errors and progress to <see cref="Error"/>.</summary>
public sealed record CliConsole(TextWriter Out, TextWriter Error)
{
    /// <summary>True when stderr is a terminal, so a live progress bar can be drawn.</summary>
    public bool ErrorIsTerminal => ReferenceEquals(Error, Console.Error) && !Console.IsErrorRedirected;
}
