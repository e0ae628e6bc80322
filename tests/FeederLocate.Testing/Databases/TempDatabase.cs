using Microsoft.Data.Sqlite;

namespace FeederLocate.Testing;

/// <summary>A fresh folder under the system temp folder holding one database path; deleted on dispose.</summary>
public sealed class TempDatabase : IDisposable
{
    public TempDatabase(string fileName = "history.db")
    {
        Folder = Directory.CreateTempSubdirectory("feederlocate-tests-").FullName;
        Path = System.IO.Path.Combine(Folder, fileName);
    }

    public string Folder { get; }

    /// <summary>The database file; not created yet.</summary>
    public string Path { get; }

    /// <summary>Another path in the same folder, for backups.</summary>
    public string Sibling(string name) => System.IO.Path.Combine(Folder, name);

    public void Dispose()
    {
        // A pooled connection would keep the file open and the folder undeletable.
        SqliteConnection.ClearAllPools();
        Directory.Delete(Folder, recursive: true);
    }
}
