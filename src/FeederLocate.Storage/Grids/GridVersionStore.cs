using System.Globalization;
using FeederLocate.Storage.Database;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Migrations;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Grids;

/// <summary>
/// The grids loaded, in the same SQLite file as the incident log: every load of a grid name is a new numbered
/// version with its text, content hash, who, when, why and source file. Nothing is replaced or removed.
/// One instance is for one thread.
/// </summary>
public sealed class GridVersionStore : IDisposable
{
    private const string Columns = "grid_name, version, content_sha256, loaded_at, loaded_by, loaded_by_role, reason, source";
    private readonly SqliteConnection _connection;
    private readonly TimeProvider _clock;
    private readonly FileWatch _file;

    private GridVersionStore(SqliteConnection connection, TimeProvider clock, string path)
    {
        _connection = connection;
        _clock = clock;
        _file = new FileWatch(path);
    }

    /// <summary>Opens (creating if absent) the database at <paramref name="path"/> and brings its schema up to date.</summary>
    public static GridVersionStore Open(string path, TimeProvider? clock = null)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        clock ??= TimeProvider.System;
        var connection = StoreConnection.Open(path);
        try
        {
            SchemaMigrator.Migrate(connection, clock, path);
            return new GridVersionStore(connection, clock, path);
        }
        catch
        {
            connection.Dispose();
            throw;
        }
    }

    /// <summary>
    /// Stores <paramref name="text"/> as the next version of <paramref name="gridName"/> (1 for a new name), in one
    /// transaction with the number read under the write lock, so two loaders never get the same number.
    /// </summary>
    public GridVersion Append(string gridName, string text, Actor loadedBy, string? reason = null, string? source = null)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(gridName);
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(loadedBy);
        _file.EnsureUnchanged();
        using var transaction = _connection.BeginTransaction();
        var next = Convert.ToInt32(Scalar(transaction, "SELECT COALESCE(MAX(version), 0) + 1 FROM grid_versions WHERE grid_name = $name", gridName), CultureInfo.InvariantCulture);
        var stored = new GridVersion(gridName, next, GridContent.Sha256(text), _clock.GetUtcNow(), loadedBy, Blank(reason), Blank(source));
        using (var command = _connection.CreateCommand())
        {
            command.Transaction = transaction;
            command.CommandText = """
                INSERT INTO grid_versions (grid_name, version, content_sha256, grid_text, loaded_at, loaded_by, loaded_by_role, reason, source)
                VALUES ($name, $version, $sha, $text, $at, $by, $role, $reason, $source)
                """;
            command.Parameters.AddWithValue("$name", gridName);
            command.Parameters.AddWithValue("$version", next);
            command.Parameters.AddWithValue("$sha", stored.ContentSha256);
            command.Parameters.AddWithValue("$text", text);
            command.Parameters.AddWithValue("$at", IsoTime.Format(stored.LoadedAt));
            command.Parameters.AddWithValue("$by", loadedBy.Name);
            command.Parameters.AddWithValue("$role", (object?)loadedBy.Role ?? DBNull.Value);
            command.Parameters.AddWithValue("$reason", (object?)stored.Reason ?? DBNull.Value);
            command.Parameters.AddWithValue("$source", (object?)stored.Source ?? DBNull.Value);
            command.ExecuteNonQuery();
        }

        transaction.Commit();
        return stored;
    }

    /// <summary>Every grid name with a stored version, in ordinal order.</summary>
    public IReadOnlyList<string> GridNames()
    {
        using var command = _connection.CreateCommand();
        command.CommandText = "SELECT DISTINCT grid_name FROM grid_versions ORDER BY grid_name";
        using var reader = command.ExecuteReader();
        var names = new List<string>();
        while (reader.Read())
        {
            names.Add(reader.GetString(0));
        }

        return [.. names.Order(StringComparer.Ordinal)];
    }

    /// <summary>The versions of <paramref name="gridName"/>, oldest first; empty for a name never loaded.</summary>
    public IReadOnlyList<GridVersion> Versions(string gridName) =>
        Read($"SELECT {Columns} FROM grid_versions WHERE grid_name = $name ORDER BY version", gridName);

    /// <summary>The newest version of <paramref name="gridName"/>, or null.</summary>
    public GridVersion? Latest(string gridName) =>
        Read($"SELECT {Columns} FROM grid_versions WHERE grid_name = $name ORDER BY version DESC LIMIT 1", gridName).FirstOrDefault();

    /// <summary>Version <paramref name="version"/> of <paramref name="gridName"/>, or null.</summary>
    public GridVersion? Find(string gridName, int version) =>
        Read($"SELECT {Columns} FROM grid_versions WHERE grid_name = $name AND version = $version", gridName, version).FirstOrDefault();

    /// <summary>The text of version <paramref name="version"/> of <paramref name="gridName"/> as loaded, or null.</summary>
    public string? TextOf(string gridName, int version)
    {
        using var command = _connection.CreateCommand();
        command.CommandText = "SELECT grid_text FROM grid_versions WHERE grid_name = $name AND version = $version";
        command.Parameters.AddWithValue("$name", gridName);
        command.Parameters.AddWithValue("$version", version);
        return command.ExecuteScalar() as string;
    }

    public void Dispose() => _connection.Dispose();

    private static string? Blank(string? text) => string.IsNullOrWhiteSpace(text) ? null : text.Trim();

    private object? Scalar(SqliteTransaction transaction, string sql, string gridName)
    {
        using var command = _connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = sql;
        command.Parameters.AddWithValue("$name", gridName);
        return command.ExecuteScalar();
    }

    private List<GridVersion> Read(string sql, string gridName, int? version = null)
    {
        ArgumentNullException.ThrowIfNull(gridName);
        using var command = _connection.CreateCommand();
        command.CommandText = sql;
        command.Parameters.AddWithValue("$name", gridName);
        if (version is { } v)
        {
            command.Parameters.AddWithValue("$version", v);
        }

        using var reader = command.ExecuteReader();
        var versions = new List<GridVersion>();
        while (reader.Read())
        {
            IsoTime.TryParse(reader.GetString(3), out var at);
            versions.Add(new GridVersion(
                reader.GetString(0),
                reader.GetInt32(1),
                reader.GetString(2),
                at,
                new Actor(reader.GetString(4), reader.IsDBNull(5) ? null : reader.GetString(5)),
                reader.IsDBNull(6) ? null : reader.GetString(6),
                reader.IsDBNull(7) ? null : reader.GetString(7)));
        }

        return versions;
    }
}
