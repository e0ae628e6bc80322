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

    public static string Repo(params string[] parts)
    {
        // The output folder lies inside the repository unless the build is given an artifacts path
        // elsewhere; then the folder this source file was compiled from still does.
        foreach (var start in new[] { AppContext.BaseDirectory, SourceDirectory() })
        {
            for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
            {
                if (File.Exists(Path.Combine(dir.FullName, "FeederLocate.sln")))
                {
                    return Path.Combine([dir.FullName, .. parts]);
                }
            }
        }

        throw new InvalidOperationException("repository root not found");
    }

    private static string SourceDirectory([System.Runtime.CompilerServices.CallerFilePath] string file = "") =>
        Path.GetDirectoryName(file) ?? string.Empty;

    public static string Sample(string scheme) => Repo("sample-grid", $"marrowdell-{scheme}.grid.json");

    public static string Tiny(string scheme) => Repo("tests", "FeederLocate.Core.Tests", "ReferenceCases", "TinyFen", $"tiny-{scheme}.grid.json");
}
