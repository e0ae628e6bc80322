using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>A segment with its posterior probability of holding the fault.</summary>
public sealed record RankedSegment(SegmentId Id, SectionId Section, double Probability);

/// <summary>A section with the sum of its segments' probabilities.</summary>
public sealed record RankedSection(SectionId Id, ImmutableArray<SegmentId> Segments, double Probability);

/// <summary>One indication checked against what a fault at the suspect would make the indicator show.</summary>
/// <param name="Probability">P(this record | the fault at the suspect) for the indicator's error rates.</param>
/// <param name="ErrorProbability">P(any record other than the expected state | the fault at the suspect).</param>
/// <param name="Stale">Read after the indicator's reset time or before a trial re-energisation.</param>
public sealed record IndicationCheck(
    IndicatorId Indicator,
    IndicatorState Observed,
    IndicatorState Expected,
    bool Agrees,
    double Probability,
    double ErrorProbability,
    bool Stale,
    string Verdict);

/// <summary>One substation measurement against the value predicted at the suspect's best-fitting fault.</summary>
public sealed record MeasurementCheck(SwitchId Device, string Quantity, double MeasuredValue, double PredictedValue, double DeviationSigma);

/// <summary>The range of distance from the substation bus, along the energised path, where the records fit, km.</summary>
public sealed record DistanceWindow(double FromKm, double ToKm);

/// <summary>Why a suspect ranks where it does.</summary>
/// <param name="FaultType">The fault type that explains the evidence best at this suspect.</param>
/// <param name="FaultResistanceOhm">The fault resistance that explains it best.</param>
public sealed record SuspectExplanation(
    SegmentId Segment,
    double Probability,
    FaultType FaultType,
    double FaultResistanceOhm,
    ImmutableArray<IndicationCheck> Agreeing,
    ImmutableArray<IndicationCheck> Disagreeing,
    ImmutableArray<MeasurementCheck> Measurements,
    DistanceWindow? DistanceWindow);

/// <summary>Two earth faults on different phases at once (isolated and resonant networks), and the sections that hold them.</summary>
public sealed record CrossCountrySuspect(SegmentId First, SegmentId Second, double Probability)
{
    public SectionId FirstSection { get; init; }

    public SectionId SecondSection { get; init; }
}

/// <summary>
/// The ranking of an incident: posterior probabilities over segments and sections (each list sums to
/// 1), whether any hypothesis explains the evidence, and the reasons.
/// </summary>
/// <param name="Disagreeing">When inconsistent: the indications the best explanation cannot account for.</param>
/// <param name="LeftOut">Indicators the operator marked suspect, left out of the ranking.</param>
/// <param name="Assumptions">What was assumed or approximated, in words, for the page and the report.</param>
public sealed record RankingResult(
    bool Consistent,
    ImmutableArray<RankedSegment> Segments,
    ImmutableArray<RankedSection> Sections,
    ImmutableArray<SuspectExplanation> Explanations,
    ImmutableArray<IndicationCheck> Disagreeing,
    ImmutableArray<CrossCountrySuspect> CrossCountry,
    ImmutableArray<IndicatorId> LeftOut,
    ImmutableDictionary<FaultType, double> FaultTypeProbabilities,
    ImmutableArray<string> Assumptions)
{
    /// <summary>
    /// A reclosure held (<c>reclosing.result = "success"</c>): the fault was transient. The ranking says
    /// where it probably was, for the patrol; nothing needs isolating.
    /// </summary>
    public bool Transient { get; init; }

    /// <summary>Indicators read more than their reset time after the fault: their readings carry no weight.</summary>
    public ImmutableArray<IndicatorId> Expired { get; init; } = [];

    /// <summary>
    /// Total probability of the cross-country pairs in <see cref="CrossCountry"/>; 0 where none is reported.
    /// Pairs are reported only where they explain the evidence better than any single fault, and then
    /// <see cref="Consistent"/> stays false: no single fault explains it.
    /// </summary>
    public double CrossCountryProbability { get; init; }

    /// <summary>
    /// Switches whose other position than recorded has a posterior probability of 5 % or more, most
    /// probable first; empty when the recorded positions fit. Where together they reach 50 %,
    /// <see cref="Consistent"/> is false: the recorded positions do not explain the evidence.
    /// </summary>
    public ImmutableArray<SwitchSuspect> SwitchSuspects { get; init; } = [];
}

/// <summary>Thrown where an incident cannot be ranked (its switch states give no radial network, nothing is energised).</summary>
public sealed class RankingException(string message) : Exception(message);
