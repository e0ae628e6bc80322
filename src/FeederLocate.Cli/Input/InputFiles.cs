using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;

namespace FeederLocate.Cli.Input;

/// <summary>Reads grid and incident files from disk: the I/O edge in front of the core's readers.</summary>
public static class InputFiles
{
    public static string ReadText(string path, string what)
    {
        try
        {
            return File.ReadAllText(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            throw new BadInputException($"error: cannot read {what} file '{path}': {e.Message}");
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
