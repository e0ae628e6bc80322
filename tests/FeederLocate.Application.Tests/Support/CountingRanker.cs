using FeederLocate.Application.Analysis;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;

namespace FeederLocate.Application.Tests.Support;

/// <summary>The core's ranking, counting its runs; while <see cref="Hold"/> is on, each run waits until <see cref="Release"/>.</summary>
public sealed class CountingRanker : IFaultRanker, IDisposable
{
    private readonly CoreFaultRanker _core = new();
    private readonly ManualResetEventSlim _open = new(initialState: true);
    private int _runs;

    public int Runs => Volatile.Read(ref _runs);

    public void Hold() => _open.Reset();

    public void Release() => _open.Set();

    public RankingResult Rank(NetworkGraph graph, Incident incident, RankingPriors priors)
    {
        Interlocked.Increment(ref _runs);
        // A guard against a test that never releases, not a measurement.
        if (!_open.Wait(TimeSpan.FromMinutes(2)))
        {
            throw new InvalidOperationException("the test never released the ranking");
        }

        return _core.Rank(graph, incident, priors);
    }

    public void Dispose() => _open.Dispose();
}
