using System.Collections.Immutable;
using System.Globalization;
using System.Reflection;

namespace FeederLocate.Storage.Migrations;

/// <summary>One numbered schema step: the SQL that takes the schema from version − 1 to version.</summary>
internal sealed record Migration(int Version, string Name, string Sql)
{
    private const string ResourcePrefix = "Migrations/";

    /// <summary>The project's steps, from the embedded <c>Migrations/NNNN-name.sql</c> files, numbered 1, 2, … without gaps.</summary>
    public static ImmutableArray<Migration> All { get; } = Load();

    private static ImmutableArray<Migration> Load()
    {
        var assembly = typeof(Migration).Assembly;
        var steps = assembly.GetManifestResourceNames()
            .Where(n => n.StartsWith(ResourcePrefix, StringComparison.Ordinal) && n.EndsWith(".sql", StringComparison.Ordinal))
            .Select(n => Read(assembly, n))
            .OrderBy(m => m.Version)
            .ToImmutableArray();
        for (var i = 0; i < steps.Length; i++)
        {
            if (steps[i].Version != i + 1)
            {
                throw new InvalidOperationException($"schema steps must be numbered 1, 2, … without gaps; step {i + 1} is numbered {steps[i].Version}");
            }
        }

        return steps;
    }

    private static Migration Read(Assembly assembly, string resource)
    {
        var file = resource[ResourcePrefix.Length..^".sql".Length];
        var dash = file.IndexOf('-', StringComparison.Ordinal);
        if (dash <= 0 || !int.TryParse(file[..dash], NumberStyles.None, CultureInfo.InvariantCulture, out var version))
        {
            throw new InvalidOperationException($"schema step {resource} must be named NNNN-name.sql");
        }

        using var stream = assembly.GetManifestResourceStream(resource)!;
        using var reader = new StreamReader(stream);
        return new Migration(version, file[(dash + 1)..], reader.ReadToEnd());
    }
}
