using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>
/// The learned reliability of one indicator, shrunk toward its kind: with m the kind's posterior mean and s
/// the shrink strength, Beta(m·s + x, (1 − m)·s + n − x) for x misses (false reports) in n trials. An
/// indicator with no history has its kind's rate; one with many trials moves toward its own x/n.
/// </summary>
public sealed record IndicatorReliability(
    IndicatorId Indicator,
    IndicatorKind Kind,
    BetaParameters Miss,
    BetaParameters FalseReport,
    ReliabilityCounts Counts,
    BetaParameters? WrongDirection = null)
{
    /// <summary>Posterior mean P(wrong direction | a direction expected and one shown), directional indicators; null for others.</summary>
    public double? WrongDirectionProbability => WrongDirection?.Mean;

    /// <summary>Posterior mean P(miss): no pickup where one was expected. 0..1.</summary>
    public double MissProbability => Miss.Mean;

    /// <summary>Posterior mean P(false report): a pickup where none was expected, or the wrong direction. 0..1.</summary>
    public double FalseReportProbability => FalseReport.Mean;

    /// <summary>90 % equal-tailed credible interval of P(miss).</summary>
    public CredibleInterval MissInterval90 => Miss.Interval(CredibleInterval.DefaultLevel);

    /// <summary>90 % equal-tailed credible interval of P(false report).</summary>
    public CredibleInterval FalseReportInterval90 => FalseReport.Interval(CredibleInterval.DefaultLevel);
}
