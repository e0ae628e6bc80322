using System.Globalization;
using System.Text.Json;
using System.Text.Json.Serialization;

namespace FeederLocate.Core.Formats.Documents;

/// <summary>
/// Writes numbers of the result documents to 12 significant digits, so that arithmetic noise
/// (15.700000000000001) does not reach the reader; 12 digits keep far more than any input carries.
/// Non-finite values are written as the named literals; reading is the plain one.
/// </summary>
public sealed class RoundedDoubleConverter : JsonConverter<double>
{
    public override double Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options)
    {
        if (reader.TokenType == JsonTokenType.String
            && double.TryParse(reader.GetString(), NumberStyles.Float, CultureInfo.InvariantCulture, out var named)
            && !double.IsFinite(named))
        {
            return named;
        }

        return reader.GetDouble();
    }

    public override void Write(Utf8JsonWriter writer, double value, JsonSerializerOptions options)
    {
        ArgumentNullException.ThrowIfNull(writer);
        if (!double.IsFinite(value))
        {
            writer.WriteStringValue(value.ToString(CultureInfo.InvariantCulture));
            return;
        }

        writer.WriteNumberValue(Round(value));
    }

    /// <summary>The double nearest the value's 12-significant-digit decimal form.</summary>
    public static double Round(double value) =>
        double.Parse(value.ToString("G12", CultureInfo.InvariantCulture), NumberStyles.Float, CultureInfo.InvariantCulture);
}
