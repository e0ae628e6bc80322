using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Migrations;

/// <summary>
/// Brings a database to the latest schema: each step not yet applied runs in its own write transaction
/// together with its row in <c>schema_version</c>, so a failed step leaves the database at the version
/// before it. Safe when two processes open the same file at once: the version is read under the write lock.
/// </summary>
internal static class SchemaMigrator
{
    public static int LatestVersion => Migration.All.Length;

    public static int Migrate(SqliteConnection connection, TimeProvider clock, string path) =>
        Migrate(connection, clock, path, Migration.All, Migration.All.Length);

    /// <summary>Applies <paramref name="steps"/> up to <paramref name="targetVersion"/>; returns the version reached.</summary>
    internal static int Migrate(
        SqliteConnection connection, TimeProvider clock, string path, IReadOnlyList<Migration> steps, int targetVersion)
    {
        ArgumentOutOfRangeException.ThrowIfGreaterThan(targetVersion, steps.Count);
        while (true)
        {
            using var transaction = connection.BeginTransaction();
            Execute(connection, transaction, """
                CREATE TABLE IF NOT EXISTS schema_version (
                    version    INTEGER PRIMARY KEY,
                    name       TEXT NOT NULL,
                    applied_at TEXT NOT NULL
                )
                """);
            var current = CurrentVersion(connection, transaction);
            if (current > steps.Count)
            {
                throw new SchemaVersionException(path, current, steps.Count);
            }

            if (current >= targetVersion)
            {
                transaction.Commit();
                return current;
            }

            var step = steps[current];
            Execute(connection, transaction, step.Sql);
            using (var record = connection.CreateCommand())
            {
                record.Transaction = transaction;
                record.CommandText = "INSERT INTO schema_version (version, name, applied_at) VALUES ($version, $name, $appliedAt)";
                record.Parameters.AddWithValue("$version", step.Version);
                record.Parameters.AddWithValue("$name", step.Name);
                record.Parameters.AddWithValue("$appliedAt", Database.IsoTime.Format(clock.GetUtcNow()));
                record.ExecuteNonQuery();
            }

            transaction.Commit();
        }
    }

    public static int CurrentVersion(SqliteConnection connection, SqliteTransaction? transaction = null)
    {
        using var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = "SELECT COALESCE(MAX(version), 0) FROM schema_version";
        return Convert.ToInt32(command.ExecuteScalar(), System.Globalization.CultureInfo.InvariantCulture);
    }

    private static void Execute(SqliteConnection connection, SqliteTransaction transaction, string sql)
    {
        using var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }
}
