namespace FeederLocate.Storage.Errors;

/// <summary>
/// The database file was deleted, or replaced by another file, while this program had it open. Nothing more
/// is written: writes would go to a file nobody can open again. Restore the file (or a backup) and restart.
/// </summary>
public sealed class DatabaseFileGoneException(string path, string what)
    : Exception($"the database file {path} {what} while in use; nothing more is saved. Restore it from a backup and restart the program.")
{
    public string Path { get; } = path;
}
