using System.Text.Json;

namespace FeederLocate.Web.Services;

/// <summary>One point of a measured learning curve: section top-1 after some recorded outcomes.</summary>
public sealed record LearningCurvePoint(int Outcomes, double SectionTop1);

/// <summary>
/// A learning curve measured by <c>feederlocate evaluate GRID --learning --json</c> on a simulated history with
/// a hot segment and a noisy indicator, against the ranking told the truth.
/// </summary>
public sealed record LearningCurve(string Grid, string HotSegment, double HotSegmentRateFactor, string NoisyIndicator, double NoisyFalseProbability,
    int TestIncidents, IReadOnlyList<LearningCurvePoint> Curve, double TruthSectionTop1);

/// <summary>
/// The measured learning curves kept beside the grids (<c>learning-curves.json</c> in the grid folder, a JSON
/// array of <c>evaluate --learning --json</c> results), read once; measuring them takes minutes, so the page
/// shows the measurement rather than repeating it.
/// </summary>
public sealed class LearningCurves
{
    /// <summary>The file's name in the grid folder.</summary>
    public const string FileName = "learning-curves.json";

    private static readonly JsonSerializerOptions Json = new(JsonSerializerDefaults.Web);
    private readonly Dictionary<string, LearningCurve> _byGrid = new(StringComparer.Ordinal);

    public LearningCurves(string gridFolder)
    {
        var path = Path.Combine(gridFolder, FileName);
        if (!File.Exists(path))
        {
            return;
        }

        try
        {
            foreach (var curve in JsonSerializer.Deserialize<List<LearningCurve>>(File.ReadAllText(path), Json) ?? [])
            {
                if (curve.Grid is not null && curve.Curve is not null)
                {
                    _byGrid[curve.Grid] = curve;
                }
            }
        }
        catch (JsonException)
        {
            // A damaged file shows no curve; the page says none was measured.
        }
    }

    /// <summary>The curve measured on the grid of that name, if any.</summary>
    public LearningCurve? For(string gridName) => _byGrid.GetValueOrDefault(gridName);
}
