using FeederLocate.Web;

FeederLocateWebApp.Build(args).Run();

/// <summary>The entry point, visible to the tests' web application factory.</summary>
public partial class Program;
