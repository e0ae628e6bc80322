using FeederLocate.Storage.Maintenance;
using FeederLocate.Web;
using FeederLocate.Web.Hosting;

// A busy port is one clear line, before the database or the first administrator is created. (Only when
// this is the program being run: a test host that builds the app chooses its own port.)
if (System.Reflection.Assembly.GetEntryAssembly() == typeof(Program).Assembly
    && ListenAddresses.Problem(ListenAddresses.For(args)) is { } problem)
{
    Console.Error.WriteLine(problem);
    return 1;
}

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
