using System.CommandLine;

namespace FeederLocate.Cli.Commands;

/// <summary>Arguments and options that several commands share.</summary>
internal static class CliOptions
{
    public static Argument<string> Grid() => new("GRID") { Description = "Grid file (feederlocate-grid/1)" };

    public static Argument<string> Incident() => new("INCIDENT") { Description = "Incident file (feederlocate-incident/1)" };

    public static Option<bool> Json() => new("--json") { Description = "Print one JSON document on stdout and nothing else" };

    public static Option<string?> Database(bool required) => new("--db")
    {
        Description = "History database (SQLite); created when it does not exist",
        Required = required,
    };
}
