using System.Globalization;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Tests.Support;

/// <summary>A plain connection to a database file, bypassing the store, for looking at and tampering with it.</summary>
public static class RawDatabase
{
    public static SqliteConnection Open(string path, bool foreignKeys = true)
    {
        var connection = new SqliteConnection(new SqliteConnectionStringBuilder
        {
            DataSource = path,
            Pooling = false,
            ForeignKeys = foreignKeys,
        }.ToString());
        connection.Open();
        return connection;
    }

    public static object? Scalar(SqliteConnection connection, string sql, params (string Name, object Value)[] parameters)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        foreach (var (name, value) in parameters)
        {
            command.Parameters.AddWithValue(name, value);
        }

        return command.ExecuteScalar();
    }

    public static long Long(SqliteConnection connection, string sql, params (string Name, object Value)[] parameters) =>
        Convert.ToInt64(Scalar(connection, sql, parameters), CultureInfo.InvariantCulture);

    public static int Execute(SqliteConnection connection, string sql, params (string Name, object Value)[] parameters)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        foreach (var (name, value) in parameters)
        {
            command.Parameters.AddWithValue(name, value);
        }

        return command.ExecuteNonQuery();
    }
}
