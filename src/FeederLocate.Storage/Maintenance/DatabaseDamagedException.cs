namespace FeederLocate.Storage.Maintenance;

/// <summary>SQLite's check found damaged pages: the program does not start on the file.</summary>
public sealed class DatabaseDamagedException(string path, IntegrityReport report)
    : Exception($"the database {path} is damaged ({string.Join("; ", report.Problems.Take(3))}). " +
        "Nothing was changed. Restore the latest backup (feederlocate backup makes one), or copy out what can be read with the sqlite3 .recover command, then start again.")
{
    public IntegrityReport Report { get; } = report;
}
