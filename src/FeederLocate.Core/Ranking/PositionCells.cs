namespace FeederLocate.Core.Ranking;

/// <summary>
/// The evidence's likelihood along one segment as an adaptive midpoint rule: the segment cut into equal
/// cells, each evaluated at its centre, and the cells near the peak cut in three (the centre kept) wherever
/// the log-likelihood still changes by more than <see cref="SmoothNats"/> from one cell to the next. Exact
/// records can make the peak far narrower than a fixed spacing (a bolted earth fault on a network with
/// kiloamperes of charging current changes |U0| by a fifth along one segment): sampled at a few fixed
/// positions the true segment's likelihood would depend on where its peak happens to fall.
/// </summary>
internal sealed class PositionCells
{
    /// <summary>Neighbouring cells closer than this in log-likelihood are taken as resolved: 1 nat.</summary>
    public const double SmoothNats = 1;

    /// <summary>Only cells within this many nats of the best explanation are cut further: e^-20 ≈ 2e-9.</summary>
    public const double PeakWindowNats = 20;

    /// <summary>At most this many rounds of cutting (cells of at least 1/81 of the first width).</summary>
    private const int MaximumRounds = 4;

    private readonly List<(double Centre, double Width, double Log)> _cells;

    private PositionCells(List<(double Centre, double Width, double Log)> cells) => _cells = cells;

    /// <summary>One equal cell around each of <paramref name="positions"/> (evenly spaced ones: the cells' centres), evaluated there.</summary>
    public static PositionCells At(IReadOnlyList<double> positions, Func<double, double> logAt) =>
        new([.. positions.Select(p => (p, 1.0 / positions.Count, logAt(p)))]);

    /// <summary>The largest log-likelihood of any cell.</summary>
    public double MaximumLog => _cells.Max(c => c.Log);

    /// <summary>The centre of the best cell.</summary>
    public double BestPosition => _cells.MaxBy(c => c.Log).Centre;

    /// <summary>log of the likelihood averaged over the segment (Σ width · likelihood; the widths sum to 1).</summary>
    public double LogMean => _cells.Aggregate(double.NegativeInfinity, (sum, c) => LogMath.Add(sum, Math.Log(c.Width) + c.Log));

    /// <summary>
    /// Cuts in three every cell that differs from a neighbour by more than <see cref="SmoothNats"/> where
    /// either of the two lies at or above <paramref name="floorLog"/>, until none does.
    /// </summary>
    public void Refine(Func<double, double> logAt, double floorLog)
    {
        for (var round = 0; round < MaximumRounds; round++)
        {
            var cut = new bool[_cells.Count];
            var any = false;
            for (var i = 0; i + 1 < _cells.Count; i++)
            {
                var (a, b) = (_cells[i].Log, _cells[i + 1].Log);
                if (Math.Max(a, b) >= floorLog && Math.Abs(a - b) > SmoothNats)
                {
                    (cut[i], cut[i + 1], any) = (true, true, true);
                }
            }

            if (!any)
            {
                return;
            }

            var next = new List<(double Centre, double Width, double Log)>(_cells.Count + 8);
            for (var i = 0; i < _cells.Count; i++)
            {
                var (centre, width, log) = _cells[i];
                if (!cut[i])
                {
                    next.Add(_cells[i]);
                    continue;
                }

                var third = width / 3;
                next.Add((centre - third, third, logAt(centre - third)));
                next.Add((centre, third, log));
                next.Add((centre + third, third, logAt(centre + third)));
            }

            _cells.Clear();
            _cells.AddRange(next);
        }
    }
}
