namespace FeederLocate.Cli.Input;

/// <summary>
/// Writes files whole or not at all: a regular file (or a new one) through a temporary file beside it, renamed
/// over it; a device or a pipe (<c>/dev/stdout</c>, a FIFO) is written to directly and never replaced.
/// </summary>
public static class OutputFiles
{
    public static void WriteWhole(string path, string text)
    {
        var full = Path.GetFullPath(path);
        if (FileKinds.IsSpecial(full))
        {
            WriteDirectly(path, full, text);
            return;
        }

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

    private static void WriteDirectly(string path, string full, string text)
    {
        try
        {
            using var stream = new FileStream(full, FileMode.Open, FileAccess.Write, FileShare.ReadWrite);
            using var writer = new StreamWriter(stream);
            writer.Write(text);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new BadInputException($"error: cannot write '{path}': {e.Message}");
        }
    }
}
