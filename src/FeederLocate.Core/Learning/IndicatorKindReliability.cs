namespace FeederLocate.Core.Learning;

/// <summary>
/// The pooled reliability of one indicator kind: prior Beta(p·n0, (1 − p)·n0) per rate, posterior after the
/// counts of every indicator of the kind, Beta(a0 + x, b0 + n − x).
/// </summary>
/// <param name="Indicators">How many of the grid's indicators are of this kind.</param>
public sealed record IndicatorKindReliability(
    IndicatorKind Kind,
    int Indicators,
    BetaParameters MissPrior,
    BetaParameters FalseReportPrior,
    BetaParameters Miss,
    BetaParameters FalseReport,
    ReliabilityCounts Counts)
{
    /// <summary>The prior of its indicators' P(miss): kind-level rate and strength, chosen by data or as configured.</summary>
    public PriorChoice.ReliabilityPriorChoice? MissChoice { get; init; }

    /// <summary>The prior of its indicators' P(false report).</summary>
    public PriorChoice.ReliabilityPriorChoice? FalseReportChoice { get; init; }

    /// <summary>The prior of its indicators' P(wrong direction); null for non-directional kinds.</summary>
    public PriorChoice.ReliabilityPriorChoice? WrongDirectionChoice { get; init; }

    /// <summary>Posterior mean P(miss): no pickup where one was expected.</summary>
    public double MissProbability => Miss.Mean;

    /// <summary>Posterior mean P(false report): a pickup where none was expected, or the wrong direction.</summary>
    public double FalseReportProbability => FalseReport.Mean;
}
