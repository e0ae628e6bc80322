using FeederLocate.Core.Learning;
using FeederLocate.Core.Learning.PriorChoice;
using FeederLocate.Core.Model;
using FeederLocate.Web.Services;

namespace FeederLocate.Web.Api;

/// <summary>
/// What a grid's history has taught, as <c>GET /api/learning?grid=NAME</c> gives it: per line type and per
/// indicator kind the prior chosen from the history (rate, strength, bounds, whether the data chose it), every
/// segment's and indicator's learned rates, the ratio of recorded to predicted substation currents, the
/// outcomes left out and why, and the grid's measured learning curve where one is kept. Numbers that do not
/// exist (a ratio with no measurements) are null.
/// </summary>
public sealed record LearningDocument(
    string Grid,
    int Outcomes,
    double ObservationYears,
    IReadOnlyList<LearningDocument.LineTypePrior> LineTypes,
    IReadOnlyList<LearningDocument.IndicatorKindPrior> IndicatorKinds,
    IReadOnlyList<LearningDocument.SegmentRate> Segments,
    IReadOnlyList<LearningDocument.IndicatorRates> Indicators,
    IReadOnlyList<LearningDocument.MeasurementRatio> MeasurementRatios,
    IReadOnlyList<LearningDocument.SkippedEntry> Skipped,
    LearningCurve? MeasuredCurve)
{
    /// <param name="StatedFaultsPer100KmYear">The rate the grid file states for the type.</param>
    /// <param name="TypeFaultsPer100KmYear">μ: the type-level rate its segments shrink toward.</param>
    /// <param name="StrengthKmYears">S: the km·years of a segment's own record that weigh as much as μ.</param>
    public sealed record LineTypePrior(
        string Id, double StatedFaultsPer100KmYear, int Faults, double ExposureKmYears, double TypeFaultsPer100KmYear,
        double StrengthKmYears, double[] BoundsKmYears, bool ChosenByData, bool AtBound);

    /// <param name="Probability">The kind-level rate its indicators shrink toward.</param>
    /// <param name="StrengthTrials">The trials of an indicator's own record that weigh as much as the kind's rate.</param>
    public sealed record ReliabilityPrior(double Probability, double StrengthTrials, double[] BoundsTrials, bool ChosenByData, bool AtBound);

    public sealed record IndicatorKindPrior(string Kind, int Indicators, ReliabilityPrior Miss, ReliabilityPrior FalseReport, ReliabilityPrior? WrongDirection);

    public sealed record SegmentRate(string Id, int Faults, double FaultsPer100KmYear, double ExpectedFaultsPerYear);

    public sealed record IndicatorRates(string Id, double MissProbability, double FalseReportProbability, double? WrongDirectionProbability);

    /// <param name="Quantity">"phase current" or "residual current".</param>
    /// <param name="GeometricMeanRatio">Recorded / predicted at the confirmed faults, geometric mean; 1 is unbiased.</param>
    /// <param name="LogRatioStandardDeviation">Spread of ln(recorded / predicted): about the relative error.</param>
    /// <param name="RelativeError">Root mean square of ln(recorded / predicted) once there are enough measurements: the ranking's tolerance of the quantity where larger.</param>
    public sealed record MeasurementRatio(string Quantity, int Measurements, double? GeometricMeanRatio, double? LogRatioStandardDeviation, double? RelativeError);

    public sealed record SkippedEntry(DateTimeOffset ReportedAt, string Segment, string Reason);

    public static LearningDocument From(Grid grid, int outcomes, LearnedPriors learned, LearningCurve? curve)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(learned);
        return new LearningDocument(
            grid.Name,
            outcomes,
            learned.FaultRates.ObservationYears,
            [.. learned.FaultRates.LineTypes.Select(t => TypePrior(grid, t))],
            [.. learned.Indicators.Kinds.Select(k => new IndicatorKindPrior(
                k.Kind.ToString(), k.Indicators, Prior(k.MissChoice!), Prior(k.FalseReportChoice!), k.WrongDirectionChoice is { } w ? Prior(w) : null))],
            [.. learned.FaultRates.Segments.Select(s => new SegmentRate(s.Segment.Value, s.Faults, s.FaultsPer100KmYear, s.ExpectedFaultsPerYear))],
            [.. learned.Indicators.Indicators.Select(i => new IndicatorRates(i.Indicator.Value, i.MissProbability, i.FalseReportProbability, i.WrongDirectionProbability))],
            [.. learned.RecordRatios.Select(r => new MeasurementRatio(r.Quantity, r.Records, Finite(r.GeometricMeanRatio), Finite(r.LogRatioStandardDeviation), Finite(r.RelativeError)))],
            [.. learned.Skipped.Select(s => new SkippedEntry(s.ReportedAt, s.Segment.Value, s.Reason))],
            curve);
    }

    private static LineTypePrior TypePrior(Grid grid, LineTypeFaultRate type)
    {
        var choice = type.Choice!;
        return new LineTypePrior(
            type.LineType.Value, grid.LineTypes.Single(l => l.Id == type.LineType).EffectiveFaultsPer100KmYear, type.Faults, type.ExposureKmYears,
            choice.MeanPer100KmYear, choice.StrengthKmYears, [choice.LowerKmYears, choice.UpperKmYears], choice.ChosenByData, choice.AtBound);
    }

    private static ReliabilityPrior Prior(ReliabilityPriorChoice choice) =>
        new(choice.Mean, choice.StrengthTrials, [choice.LowerTrials, choice.UpperTrials], choice.ChosenByData, choice.AtBound);

    private static double? Finite(double value) => double.IsFinite(value) ? value : null;
}
