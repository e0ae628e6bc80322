namespace FeederLocate.Cli.Input;

/// <summary>Writes files whole or not at all: into a temporary file beside the target, then renamed over it.</summary>
public static class OutputFiles
{
    public static void WriteWhole(string path, string text)
    {
        var full = Path.GetFullPath(path);
        var temporary = full + $".{Environment.ProcessId}.tmp";
        try
        {
            File.WriteAllText(temporary, text);
            File.Move(temporary, full, overwrite: true);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            File.Delete(temporary);
            throw new BadInputException($"error: cannot write '{path}': {e.Message}");
        }
    }
}
