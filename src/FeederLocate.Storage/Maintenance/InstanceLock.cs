namespace FeederLocate.Storage.Maintenance;

/// <summary>
/// Claims a database for one long-running program (the web app): an exclusive lock on the file
/// <c>DATABASE.lock</c> beside it, held until disposed and released by the system if the process dies.
/// A second web app on the same database is refused with <see cref="DatabaseInUseException"/>: it would not
/// see the first one's changes live. Short command-line runs do not take it and may share the file.
/// </summary>
public sealed class InstanceLock : IDisposable
{
    private readonly FileStream _file;

    private InstanceLock(FileStream file, string lockPath)
    {
        _file = file;
        LockPath = lockPath;
    }

    /// <summary>The lock file.</summary>
    public string LockPath { get; }

    public static string LockPathOf(string databasePath) => Path.GetFullPath(databasePath) + ".lock";

    public static InstanceLock Claim(string databasePath)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(databasePath);
        var lockPath = LockPathOf(databasePath);
        try
        {
            // FileShare.None is an exclusive advisory lock (flock) on Unix, a sharing mode on Windows.
            var file = new FileStream(lockPath, FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None);
            return new InstanceLock(file, lockPath);
        }
        catch (IOException e) when (e is not FileNotFoundException and not DirectoryNotFoundException)
        {
            throw new DatabaseInUseException(databasePath, lockPath, e);
        }
    }

    public void Dispose() => _file.Dispose();
}

/// <summary>Another program already serves the database (it holds the lock file).</summary>
public sealed class DatabaseInUseException(string databasePath, string lockPath, Exception inner)
    : Exception($"the database {databasePath} is already served by another FeederLocate web app (it holds {lockPath}). " +
        "Stop that one first, or give this one its own database with --FeederLocate:DatabasePath.", inner);
