namespace FeederLocate.Web.Components.Charts;

/// <summary>One series of a bar chart: a label and one value per category.</summary>
public sealed record ChartSeries(string Label, IReadOnlyList<double> Values);
