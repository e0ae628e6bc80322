using FeederLocate.Core.Formats;
using FeederLocate.Core.Ranking;

namespace FeederLocate.Core.Formats.Documents;

/// <summary>The <c>rank</c> document: the contract's fields first, then the reasons.</summary>
public sealed record RankingDocument(
    bool Consistent,
    IReadOnlyList<RankingDocument.SegmentEntry> Segments,
    IReadOnlyList<RankingDocument.SectionEntry> Sections,
    IReadOnlyList<RankingDocument.SuspectEntry> Suspects,
    IReadOnlyList<RankingDocument.CheckEntry> Disagreeing,
    RankingDocument.CrossCountryEntry? CrossCountry,
    IReadOnlyList<string> LeftOut,
    IReadOnlyDictionary<string, double> FaultTypes,
    IReadOnlyList<string> Assumptions)
{
    /// <summary>A reclosure held: the fault was transient (ranked for the patrol; nothing needs isolating).</summary>
    public bool Transient { get; init; }

    /// <summary>Indicators read more than their reset time after the fault: their readings carried no weight.</summary>
    public IReadOnlyList<string> Expired { get; init; } = [];

    /// <summary>
    /// Switches whose other position than recorded has a posterior probability of 5 % or more, most
    /// probable first (FORMATS.md); empty when the recorded positions fit.
    /// </summary>
    public IReadOnlyList<SwitchSuspectEntry> SwitchSuspects { get; init; } = [];

    public static RankingDocument From(RankingResult r) => new(
        r.Consistent,
        [.. r.Segments.Select(s => new SegmentEntry(s.Id.Value, s.Section.Value, s.Probability))],
        [.. r.Sections.Select(s => new SectionEntry(s.Id.Value, [.. s.Segments.Select(x => x.Value)], s.Probability))],
        [.. r.Explanations.Select(e => new SuspectEntry(
            e.Segment.Value, e.Probability, e.FaultType.ToString(), e.FaultResistanceOhm,
            [.. e.Agreeing.Select(CheckEntry.From)], [.. e.Disagreeing.Select(CheckEntry.From)],
            [.. e.Measurements.Select(m => new MeasurementEntry(m.Device.Value, m.Quantity, m.MeasuredValue, m.PredictedValue, m.DeviationSigma))],
            e.DistanceWindow is { } w ? new WindowEntry(w.FromKm, w.ToKm) : null))],
        [.. r.Disagreeing.Select(CheckEntry.From)],
        r.CrossCountry.IsDefaultOrEmpty ? null : new CrossCountryEntry(
            r.CrossCountryProbability,
            [.. r.CrossCountry.Select(c => new PairEntry([c.First.Value, c.Second.Value], [c.FirstSection.Value, c.SecondSection.Value], c.Probability))]),
        [.. r.LeftOut.Select(i => i.Value)],
        r.FaultTypeProbabilities.ToDictionary(p => p.Key.ToString(), p => p.Value),
        r.Assumptions)
    {
        Transient = r.Transient,
        Expired = [.. r.Expired.Select(i => i.Value)],
        SwitchSuspects = [.. r.SwitchSuspects.Select(s => new SwitchSuspectEntry(s.Device.Value, IncidentFormat.Name(s.State), s.Probability, s.Section.Value, s.SectionProbability))],
    };

    public sealed record SegmentEntry(string Id, string Section, double Probability);

    public sealed record SectionEntry(string Id, IReadOnlyList<string> Segments, double Probability);

    public sealed record SuspectEntry(
        string Segment,
        double Probability,
        string FaultType,
        double FaultResistanceOhm,
        IReadOnlyList<CheckEntry> Agreeing,
        IReadOnlyList<CheckEntry> Disagreeing,
        IReadOnlyList<MeasurementEntry> Measurements,
        WindowEntry? DistanceWindowKm);

    public sealed record CheckEntry(string Indicator, string Observed, string Expected, double Probability, bool Stale, string Verdict)
    {
        public static CheckEntry From(IndicationCheck c) =>
            new(c.Indicator.Value, IncidentFormat.Name(c.Observed), IncidentFormat.Name(c.Expected), c.Probability, c.Stale, c.Verdict);
    }

    public sealed record MeasurementEntry(string Device, string Quantity, double Measured, double Predicted, double DeviationSigma);

    public sealed record WindowEntry(double FromKm, double ToKm);

    /// <summary>Present where a pair of earth faults on different phases explains the evidence better than any single fault.</summary>
    public sealed record CrossCountryEntry(double Probability, IReadOnlyList<PairEntry> Pairs);

    /// <summary>A switch probably in <paramref name="State"/> ("open" or "closed"), and the most probable section were it so.</summary>
    public sealed record SwitchSuspectEntry(string Device, string State, double Probability, string Section, double SectionProbability);

    public sealed record PairEntry(IReadOnlyList<string> Segments, IReadOnlyList<string> Sections, double Probability);
}
