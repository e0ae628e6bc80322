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

FeederLocateWebApp.Build(args).Run();
return 0;

/// <summary>The entry point, visible to the tests' web application factory.</summary>
public partial class Program;
