namespace FeederLocate.Core.Learning;

/// <summary>
/// Prior rates of the indicator kinds and how strongly they are held. The default rates are from memory,
/// typical figures for fault passage indicators (common practice, no single source): a remote indicator
/// misses 5 % of the faults it should see and reports falsely in 2 % of the faults it should not; one read
/// in the field misses 8 % and reports falsely 4 %, the extra covering flags reset or misread before the crew arrives.
/// </summary>
public sealed record IndicatorReliabilityOptions
{
    public static IndicatorReliabilityOptions Default { get; } = new();

    /// <summary>Prior P(miss) of a remote indicator (default 0.05). Strictly between 0 and 1.</summary>
    public double RemoteMissProbability { get; init => field = Probability(value, nameof(RemoteMissProbability)); } = 0.05;

    /// <summary>Prior P(false report) of a remote indicator (default 0.02). Strictly between 0 and 1.</summary>
    public double RemoteFalseReportProbability { get; init => field = Probability(value, nameof(RemoteFalseReportProbability)); } = 0.02;

    /// <summary>Prior P(miss) of an indicator read in the field (default 0.08). Strictly between 0 and 1.</summary>
    public double FieldMissProbability { get; init => field = Probability(value, nameof(FieldMissProbability)); } = 0.08;

    /// <summary>Prior P(false report) of an indicator read in the field (default 0.04). Strictly between 0 and 1.</summary>
    public double FieldFalseReportProbability { get; init => field = Probability(value, nameof(FieldFalseReportProbability)); } = 0.04;

    /// <summary>
    /// n0: the kind's prior rate weighs like this many trials (default 20): prior Beta(p·n0, (1 − p)·n0).
    /// Must be &gt; 0.
    /// </summary>
    public double PriorStrength { get; init => field = Positive(value, nameof(PriorStrength)); } = 20;

    /// <summary>
    /// s: the kind's learned rate weighs like this many trials of the indicator itself (default 10).
    /// Must be &gt; 0.
    /// </summary>
    public double ShrinkStrength { get; init => field = Positive(value, nameof(ShrinkStrength)); } = 10;

    /// <summary>
    /// Choose each kind's rates and strengths by empirical Bayes (maximum marginal likelihood of the counted
    /// trials, see <see cref="PriorChoice.ReliabilityPriorChoice"/>) instead of taking <see cref="ShrinkStrength"/>
    /// and the pooled posterior means. Default false; the ranking's learning turns it on.
    /// </summary>
    public bool ChooseStrengthsByData { get; init; }

    /// <summary>
    /// With <see cref="ChooseStrengthsByData"/>: set apart the indicators whose records the kind's prior cannot
    /// explain (<see cref="PriorChoice.DistinctMembers"/>), choose the kind's rate and strength from the rest and
    /// give those the weak prior at <see cref="MinimumStrengthTrials"/>, so one indicator erring far more often than
    /// its kind neither widens the kind's spread nor pulls its rate. Default false; the ranking's learning turns it on.
    /// </summary>
    public bool SetApartDistinctIndicators { get; init; }

    /// <summary>
    /// π: the prior share of a kind's indicators that are distinct in one error rate (default 0.05, one in twenty;
    /// from memory, a setting rather than a measured figure). Between 0 and 0.5.
    /// </summary>
    public double DistinctIndicatorShare
    {
        get;
        init => field = value is > 0 and < 0.5 ? value : throw new ArgumentOutOfRangeException(nameof(DistinctIndicatorShare), value, $"{nameof(DistinctIndicatorShare)} must lie between 0 and 0.5");
    } = 0.05;

    /// <summary>Lower bound of the chosen strength in trials (default 2).</summary>
    public double MinimumStrengthTrials { get; init => field = Positive(value, nameof(MinimumStrengthTrials)); } = 2;

    /// <summary>Upper bound of the chosen strength in trials (default 1000): at this strength every indicator of the kind has the kind's rate.</summary>
    public double MaximumStrengthTrials { get; init => field = Positive(value, nameof(MaximumStrengthTrials)); } = 1000;

    /// <summary>
    /// Prior P(wrong direction) of a directional indicator that picks up where a direction was expected
    /// (default 0.01, half the false-report rate, as the ranking assumes without history; common practice).
    /// </summary>
    public double WrongDirectionProbability { get; init => field = Probability(value, nameof(WrongDirectionProbability)); } = 0.01;

    /// <summary>Prior P(miss) of the kind.</summary>
    public double MissProbability(IndicatorKind kind) => kind.Remote ? RemoteMissProbability : FieldMissProbability;

    /// <summary>Prior P(false report) of the kind.</summary>
    public double FalseReportProbability(IndicatorKind kind) => kind.Remote ? RemoteFalseReportProbability : FieldFalseReportProbability;

    private static double Probability(double value, string name) =>
        value > 0 && value < 1
            ? value
            : throw new ArgumentOutOfRangeException(name, value, $"{name} must lie strictly between 0 and 1");

    private static double Positive(double value, string name) =>
        double.IsFinite(value) && value > 0
            ? value
            : throw new ArgumentOutOfRangeException(name, value, $"{name} must be finite and > 0");
}
