namespace FeederLocate.Cli.Input;

/// <summary>Bad input from the user: each line goes to stderr and the command exits 2.</summary>
public sealed class BadInputException(IReadOnlyList<string> lines) : Exception(string.Join(Environment.NewLine, lines))
{
    public BadInputException(string line)
        : this([line])
    {
    }

    public IReadOnlyList<string> Lines { get; } = lines;
}
