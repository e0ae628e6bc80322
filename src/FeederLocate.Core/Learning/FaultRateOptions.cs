namespace FeederLocate.Core.Learning;

/// <summary>How strongly the fault-rate priors are held and how long the history counts for.</summary>
public sealed record FaultRateOptions
{
    /// <summary>Days in the year used to turn a span of time into years (the Julian year).</summary>
    public const double DaysPerYear = 365.25;

    public static FaultRateOptions Default { get; } = new();

    /// <summary>
    /// E0: the line type's stated rate weighs like this much observed exposure, in km·years
    /// (default 50). Prior Gamma((r/100)·E0, E0) for r faults per 100 km·year. Must be &gt; 0.
    /// </summary>
    public double PriorExposureKmYears
    {
        get;
        init => field = Positive(value, nameof(PriorExposureKmYears));
    } = 50;

    /// <summary>
    /// S: the line type's learned rate weighs like this much exposure of the segment itself, in
    /// km·years (default 10): a segment's own record outweighs its type once its length × years passes S.
    /// Must be &gt; 0.
    /// </summary>
    public double SegmentShrinkKmYears
    {
        get;
        init => field = Positive(value, nameof(SegmentShrinkKmYears));
    } = 10;

    /// <summary>
    /// Length of the observed history in years. Null (the default) takes the span from the earliest to
    /// the latest confirmed fault, but at least <see cref="MinimumObservationYears"/>. Must be &gt; 0 when given.
    /// </summary>
    public double? ObservationYears
    {
        get;
        init => field = value is { } years ? Positive(years, nameof(ObservationYears)) : null;
    }

    /// <summary>
    /// Floor on the span-derived history length in years (default 1): one fault, or several in a short
    /// spell, would otherwise claim almost no exposure and an absurd rate. Must be &gt; 0.
    /// </summary>
    public double MinimumObservationYears
    {
        get;
        init => field = Positive(value, nameof(MinimumObservationYears));
    } = 1;

    /// <summary>
    /// Choose each line type's segment-level strength S and type-level rate by empirical Bayes (maximum
    /// marginal likelihood of the logged faults, see <see cref="PriorChoice.FaultRatePriorChoice"/>) instead of
    /// taking <see cref="SegmentShrinkKmYears"/> and the pooled posterior mean. Default false; the ranking's
    /// learning turns it on.
    /// </summary>
    public bool ChooseStrengthsByData { get; init; }

    /// <summary>
    /// With <see cref="ChooseStrengthsByData"/>: set apart the segments whose records the line type's prior cannot
    /// explain (<see cref="PriorChoice.DistinctMembers"/>), choose μ and S from the rest and give those the weak
    /// prior at <see cref="MinimumStrengthKmYears"/>, so one segment failing far more often than its type neither
    /// widens the type's spread nor pulls its rate. Default false; the ranking's learning turns it on.
    /// </summary>
    public bool SetApartDistinctSegments { get; init; }

    /// <summary>
    /// π: the prior share of a line type's segments that are distinct (default 0.05, one in twenty; from memory,
    /// a setting rather than a measured figure). A segment is set apart where its record is more than
    /// (1 − π)/π = 19 times as probable under the weak prior as under the type's. Between 0 and 0.5.
    /// </summary>
    public double DistinctSegmentShare
    {
        get;
        init => field = value is > 0 and < 0.5 ? value : throw new ArgumentOutOfRangeException(nameof(DistinctSegmentShare), value, $"{nameof(DistinctSegmentShare)} must lie between 0 and 0.5");
    } = 0.05;

    /// <summary>Lower bound of the chosen S in km·years (default 5): no segment's own record outweighs its type before 5 km·years.</summary>
    public double MinimumStrengthKmYears
    {
        get;
        init => field = Positive(value, nameof(MinimumStrengthKmYears));
    } = 5;

    /// <summary>Upper bound of the chosen S in km·years (default 5000): at this strength every segment of the type has the type's rate.</summary>
    public double MaximumStrengthKmYears
    {
        get;
        init => field = Positive(value, nameof(MaximumStrengthKmYears));
    } = 5000;

    private static double Positive(double value, string name) =>
        double.IsFinite(value) && value > 0
            ? value
            : throw new ArgumentOutOfRangeException(name, value, $"{name} must be finite and > 0");
}
