using System.Collections.Immutable;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Maintenance;

/// <summary>Integrity check and online backup of an open database.</summary>
internal static class DatabaseChecks
{
    public static IntegrityReport Check(SqliteConnection connection) => Check(connection, "PRAGMA integrity_check");

    /// <summary>SQLite's quicker check (every page readable and well-formed, no index cross-check): run at start-up.</summary>
    public static IntegrityReport QuickCheck(SqliteConnection connection) => Check(connection, "PRAGMA quick_check");

    private static IntegrityReport Check(SqliteConnection connection, string pragma)
    {
        try
        {
            return CheckOrThrow(connection, pragma);
        }
        catch (SqliteException e)
        {
            // A damaged page can stop the check itself ("database disk image is malformed").
            return new IntegrityReport([$"the check could not finish: {e.Message}"]);
        }
    }

    private static IntegrityReport CheckOrThrow(SqliteConnection connection, string pragma)
    {
        var problems = ImmutableArray.CreateBuilder<string>();
        using (var command = connection.CreateCommand())
        {
            command.CommandText = pragma;
            using var reader = command.ExecuteReader();
            while (reader.Read())
            {
                var message = reader.GetString(0);
                if (message != "ok")
                {
                    problems.Add(message);
                }
            }
        }

        using (var command = connection.CreateCommand())
        {
            command.CommandText = "PRAGMA foreign_key_check";
            using var reader = command.ExecuteReader();
            while (reader.Read())
            {
                problems.Add($"{reader.GetString(0)} row {reader.GetValue(1)} refers to a missing row of {reader.GetString(2)}");
            }
        }

        return new IntegrityReport(problems.ToImmutable());
    }

    /// <summary>
    /// Copies the live database, committed transactions of every process included, into <paramref name="destinationPath"/>
    /// (replaced if it exists) with SQLite's online backup; writers elsewhere may go on meanwhile.
    /// </summary>
    public static void Backup(SqliteConnection source, string sourcePath, string destinationPath)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(destinationPath);
        if (string.Equals(Path.GetFullPath(destinationPath), Path.GetFullPath(sourcePath), StringComparison.Ordinal))
        {
            throw new ArgumentException($"backup target {destinationPath} is the database itself", nameof(destinationPath));
        }

        var builder = new SqliteConnectionStringBuilder
        {
            DataSource = destinationPath,
            Mode = SqliteOpenMode.ReadWriteCreate,
            Pooling = false,
        };
        using var destination = new SqliteConnection(builder.ToString());
        destination.Open();
        source.BackupDatabase(destination);
    }
}
