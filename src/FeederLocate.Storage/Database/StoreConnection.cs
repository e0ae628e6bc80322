using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Database;

/// <summary>
/// Opens a connection the way every process sharing the file must: foreign keys on, a busy timeout so a
/// writer waits for another instead of failing, and write-ahead logging so readers never block the writer.
/// </summary>
internal static class StoreConnection
{
    /// <summary>How long a statement waits for another process's write lock before failing.</summary>
    public static readonly TimeSpan BusyTimeout = TimeSpan.FromSeconds(15);

    public static SqliteConnection Open(string path, bool create = true)
    {
        var builder = new SqliteConnectionStringBuilder
        {
            DataSource = path,
            Mode = create ? SqliteOpenMode.ReadWriteCreate : SqliteOpenMode.ReadWrite,
            ForeignKeys = true,
            // No pooling: a closed store leaves no handle on the file, so it can be moved or deleted.
            Pooling = false,
            DefaultTimeout = (int)BusyTimeout.TotalSeconds,
        };
        var connection = new SqliteConnection(builder.ToString());
        try
        {
            connection.Open();
            using var command = connection.CreateCommand();
            command.CommandText = $"PRAGMA busy_timeout = {(int)BusyTimeout.TotalMilliseconds}";
            command.ExecuteNonQuery();
            command.CommandText = "PRAGMA journal_mode = WAL";
            command.ExecuteNonQuery();
            return connection;
        }
        catch
        {
            connection.Dispose();
            throw;
        }
    }
}
