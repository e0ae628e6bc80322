using System.Globalization;

namespace FeederLocate.Storage.Export;

/// <summary>
/// CSV as RFC 4180 defines it: records end with CRLF; a field holding a comma, a double quote, CR or LF is
/// enclosed in double quotes, and a double quote inside it is doubled.
/// </summary>
internal static class Csv
{
    public const string RecordEnd = "\r\n";

    public static void WriteRow(TextWriter writer, IEnumerable<string?> fields)
    {
        var first = true;
        foreach (var field in fields)
        {
            if (!first)
            {
                writer.Write(',');
            }

            writer.Write(Field(field));
            first = false;
        }

        writer.Write(RecordEnd);
    }

    public static string Field(string? value)
    {
        if (string.IsNullOrEmpty(value))
        {
            return string.Empty;
        }

        return value.AsSpan().IndexOfAny(",\"\r\n") < 0
            ? value
            : "\"" + value.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"";
    }

    /// <summary>A number in invariant culture, shortest text that reads back to the same value.</summary>
    public static string Number(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    public static string Number(int value) => value.ToString(CultureInfo.InvariantCulture);
}
