using System.Text;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;

namespace FeederLocate.Cli.Input;

/// <summary>Reads grid and incident files from disk: the I/O edge in front of the core's readers.</summary>
public static class InputFiles
{
    private static readonly UTF8Encoding StrictUtf8 = new(encoderShouldEmitUTF8Identifier: false, throwOnInvalidBytes: true);

    private static readonly byte[] ByteOrderMark = [0xEF, 0xBB, 0xBF];

    /// <summary>
    /// Reads a text file of at most <see cref="InputLimits.MaxFileBytes"/> (a device such as /dev/zero included:
    /// reading stops at the limit) that must be valid UTF-8; anything else is bad input, named with the file.
    /// </summary>
    public static string ReadText(string path, string what)
    {
        byte[] bytes;
        try
        {
            using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite);
            using var memory = new MemoryStream();
            var buffer = new byte[81920];
            int read;
            while ((read = stream.Read(buffer)) > 0)
            {
                if (memory.Length + read > InputLimits.MaxFileBytes)
                {
                    throw new BadInputException($"error: {what} file '{path}' is larger than {InputLimits.MaxFileBytes / (1024 * 1024)} MB, the most this program reads");
                }

                memory.Write(buffer, 0, read);
            }

            bytes = memory.ToArray();
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            throw new BadInputException($"error: cannot read {what} file '{path}': {e.Message}");
        }

        try
        {
            // A leading byte order mark is allowed and skipped (RFC 8259 §8.1); this encoding's own Preamble is empty.
            var start = bytes.AsSpan().StartsWith(ByteOrderMark) ? ByteOrderMark.Length : 0;
            return StrictUtf8.GetString(bytes, start, bytes.Length - start);
        }
        catch (DecoderFallbackException e)
        {
            throw new BadInputException($"error: {what} file '{path}' is not valid UTF-8 (at byte {e.Index}): nothing was read");
        }
    }

    /// <summary>Reads a grid file; warnings go to <paramref name="error"/>, errors end the command with exit 2.</summary>
    public static Grid LoadGrid(string path, TextWriter error)
    {
        var result = GridReader.Parse(ReadText(path, "grid"));
        return Checked(result, error);
    }

    /// <summary>Reads an incident file against its grid.</summary>
    public static Incident LoadIncident(string path, Grid grid, TextWriter error)
    {
        var result = IncidentReader.Parse(ReadText(path, "incident"), grid);
        return Checked(result, error);
    }

    /// <summary>
    /// Refuses an incident whose own <c>grid</c> (relative to the incident file) names another grid than
    /// the one given on the command line: a file of the same path, or of the same content, is the same grid;
    /// a named file that does not exist (an incident copied elsewhere) cannot be checked and is let pass.
    /// </summary>
    public static void CheckGridReference(Incident incident, string incidentPath, string gridPath)
    {
        ArgumentNullException.ThrowIfNull(incident);
        if (incident.GridReference is not { } reference)
        {
            return;
        }

        if (reference.IndexOfAny(Path.GetInvalidPathChars()) >= 0)
        {
            throw new BadInputException("error: incident file: grid must be a file path; it holds a character no path may hold (a control character such as U+0000)");
        }

        var named = Path.GetFullPath(Path.Combine(Path.GetDirectoryName(Path.GetFullPath(incidentPath)) ?? ".", reference));
        var given = Path.GetFullPath(gridPath);
        if (string.Equals(named, given, StringComparison.Ordinal))
        {
            return;
        }

        if (!File.Exists(named) || File.ReadAllText(named) == ReadText(gridPath, "grid"))
        {
            return;
        }

        throw new BadInputException($"error: incident file: grid names \"{reference}\" ({named}), not the grid given ({given}); give the grid the incident was recorded on, or correct its grid field");
    }

    private static T Checked<T>(LoadResult<T> result, TextWriter error)
        where T : class
    {
        foreach (var warning in result.Warnings)
        {
            error.WriteLine($"warning: {warning}");
        }

        return result.Value ?? throw new BadInputException([.. result.Errors.Select(e => $"error: {e}")]);
    }
}
