using FeederLocate.Storage.Maintenance;
using FeederLocate.Web;

try
{
    FeederLocateWebApp.Build(args).Run();
    return 0;
}
catch (Exception e) when (e is DatabaseInUseException or DatabaseDamagedException)
{
    // A refusal to start, not a crash: one clear sentence and exit 2.
    Console.Error.WriteLine($"FeederLocate does not start: {e.Message}");
    return 2;
}

/// <summary>The entry point, visible to the tests' web application factory.</summary>
public partial class Program;
