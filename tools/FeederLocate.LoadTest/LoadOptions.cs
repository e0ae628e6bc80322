namespace FeederLocate.LoadTest;

/// <summary>What one load run does: how many clients, for how long, on how many incidents of which grids.</summary>
/// <param name="Clients">Concurrent clients, each posting to one incident and reading its ranking (1..1000).</param>
/// <param name="Duration">How long the clients keep starting requests; requests in flight then finish.</param>
/// <param name="Incidents">Incidents opened across the grids; client k works on incident k mod Incidents.</param>
/// <param name="GridFolder">Folder of <c>*.grid.json</c> files the app loads and the incidents are opened on.</param>
/// <param name="Seed">Seed of the clients' random choice of indicators and states.</param>
/// <param name="ReportPath">Where to write the report as JSON; null writes none.</param>
public sealed record LoadOptions(
    int Clients,
    TimeSpan Duration,
    int Incidents,
    string GridFolder,
    int Seed = 1,
    string? ReportPath = null)
{
    public const int DefaultClients = 20;
    public const int DefaultSeconds = 60;
    public const int DefaultIncidents = 5;

    /// <summary>Every problem with the options, each naming the option, its value and what is allowed.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        if (Clients is < 1 or > 1000)
        {
            problems.Add($"--clients must be within 1..1000, got {Clients}");
        }

        if (Duration <= TimeSpan.Zero || Duration > TimeSpan.FromHours(24))
        {
            problems.Add($"--seconds must be within 1..86400, got {Duration.TotalSeconds}");
        }

        if (Incidents is < 1 or > 1000)
        {
            problems.Add($"--incidents must be within 1..1000, got {Incidents}");
        }

        if (!Directory.Exists(GridFolder))
        {
            problems.Add($"--grid-folder \"{GridFolder}\" is not a folder");
        }

        return problems;
    }
}
