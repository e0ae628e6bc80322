namespace FeederLocate.Storage.Migrations;

/// <summary>The database was written by a newer program: its schema is beyond what this one knows.</summary>
public sealed class SchemaVersionException(string path, int version, int latestKnown)
    : Exception($"database {path} has schema version {version}; this program knows versions up to {latestKnown}. Use a newer program.")
{
    public string Path { get; } = path;

    public int Version { get; } = version;

    public int LatestKnown { get; } = latestKnown;
}
