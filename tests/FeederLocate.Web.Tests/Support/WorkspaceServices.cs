using FeederLocate.Application.Analysis;
using FeederLocate.Application.Evidence;
using FeederLocate.Application.Grids;
using FeederLocate.Application.Lifecycle;
using FeederLocate.Application.Switching;
using FeederLocate.Application.Times;
using FeederLocate.Storage;
using FeederLocate.Web.Services;
using Microsoft.Extensions.DependencyInjection;

namespace FeederLocate.Web.Tests.Support;

/// <summary>The application services the incident page injects, over one incident board, as the app registers them.</summary>
internal static class WorkspaceServices
{
    public static IncidentAnalysis Add(IServiceCollection services, GridCatalog grids, IncidentBoard board, IncidentAnalysis analysis)
    {
        services.AddSingleton(grids);
        services.AddSingleton(board);
        services.AddSingleton(analysis);
        services.AddSingleton(new CheckedSwitching(board, analysis));
        services.AddSingleton(new IncidentLifecycle(board, analysis));
        services.AddSingleton(new ReturnSwitching(board, analysis));
        services.AddSingleton(new EvidenceIntake(board, TimeProvider.System));
        services.AddSingleton(new IncidentTimesEntry(board, TimeProvider.System));
        services.AddSingleton(TimeProvider.System);
        services.AddSingleton(new IncidentGridMove(board, grids.Versions));
        return analysis;
    }
}
