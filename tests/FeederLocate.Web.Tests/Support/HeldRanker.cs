using FeederLocate.Application.Analysis;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;

namespace FeederLocate.Web.Tests.Support;

/// <summary>The core's ranking, which waits while the test holds it (to see a page while the ranking runs).</summary>
public sealed class HeldRanker : IFaultRanker, IDisposable
{
    private readonly CoreFaultRanker _core = new();
    private readonly ManualResetEventSlim _open = new(initialState: true);

    public void Hold() => _open.Reset();

    public void Release() => _open.Set();

    public RankingResult Rank(NetworkGraph graph, Incident incident, RankingPriors priors)
    {
        // A guard against a test that never releases, not a measurement.
        if (!_open.Wait(TimeSpan.FromMinutes(2)))
        {
            throw new InvalidOperationException("the test never released the ranking");
        }

        return _core.Rank(graph, incident, priors);
    }

    public void Dispose() => _open.Dispose();
}
