namespace FeederLocate.Storage.Errors;

/// <summary>A command that reads or checks a database was given a path with no file: nothing is created.</summary>
public sealed class DatabaseMissingException(string path)
    : Exception($"there is no database at {path}: check the path (nothing was created)")
{
    public string Path { get; } = path;
}
