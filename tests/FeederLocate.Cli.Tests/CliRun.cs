using System.Text.Json;

namespace FeederLocate.Cli.Tests;

/// <summary>Runs the command line in-process and captures what it prints.</summary>
public sealed record CliRun(int ExitCode, string Out, string Error)
{
    public static CliRun Of(params string[] args)
    {
        var output = new StringWriter();
        var error = new StringWriter();
        var code = CliApp.Run(args, output, error);
        return new CliRun(code, output.ToString(), error.ToString());
    }

    public JsonElement Json()
    {
        using var document = JsonDocument.Parse(Out);
        return document.RootElement.Clone();
    }
}
