using System.Globalization;
using System.Text.Json;

namespace FeederLocate.Core.Formats;

/// <summary>
/// Reads the fields of one JSON object (one grid element) and reports each missing, mistyped or
/// out-of-range field against the element's kind and id. Fields it was not asked for are warned about
/// (a misspelt optional field would otherwise be ignored without a word).
/// </summary>
internal sealed class ElementReader
{
    /// <summary>The largest magnitude any number in a grid or incident file may have.</summary>
    public const double MaximumMagnitude = 1e9;

    private readonly JsonElement _element;
    private readonly IssueLog _log;
    private readonly HashSet<string> _asked = new(StringComparer.Ordinal);

    public ElementReader(JsonElement element, string kind, string id, IssueLog log)
    {
        _element = element;
        Kind = kind;
        Id = id;
        _log = log;
    }

    public string Kind { get; }

    public string Id { get; }

    /// <summary>Opens array item <paramref name="index"/> of <paramref name="kind"/>, labelled by its id (or #index).</summary>
    public static ElementReader? ForItem(JsonElement item, string kind, int index, IssueLog log)
    {
        if (item.ValueKind != JsonValueKind.Object)
        {
            log.Error(kind, $"#{index + 1}", string.Empty, $"must be an object, got {Describe(item)}");
            return null;
        }

        var id = item.TryGetProperty("id", out var idValue) && idValue.ValueKind == JsonValueKind.String
            && !string.IsNullOrWhiteSpace(idValue.GetString())
                ? idValue.GetString()!
                : $"#{index + 1}";
        return new ElementReader(item, kind, id, log);
    }

    public void Error(string field, string message) => _log.Error(Kind, Id, field, message);

    public string? RequiredString(string field) => String(field, required: true);

    public string? OptionalString(string field) => String(field, required: false);

    public double? RequiredNumber(string field, NumberRange range) => Number(field, range, required: true);

    public double? OptionalNumber(string field, NumberRange range) => Number(field, range, required: false);

    public bool? RequiredBool(string field) => Bool(field, required: true);

    public bool? OptionalBool(string field) => Bool(field, required: false);

    public int? OptionalCount(string field)
    {
        var value = Number(field, NumberRange.AtLeast(0), required: false);
        if (value is null)
        {
            return null;
        }

        if (value.Value != Math.Floor(value.Value) || value.Value > int.MaxValue)
        {
            Error(field, $"must be a whole number, got {Format(value.Value)}");
            return null;
        }

        return (int)value.Value;
    }

    /// <summary>A nested object, or null (reported when required).</summary>
    public ElementReader? Object(string field, bool required, string? nestedKind = null)
    {
        if (!TryGet(field, required, out var value) || IsNull(value, field, required))
        {
            return null;
        }

        if (value.ValueKind != JsonValueKind.Object)
        {
            Error(field, $"must be an object, got {Describe(value)}");
            return null;
        }

        return new ElementReader(value, nestedKind ?? Kind, nestedKind is null ? $"{Id} {field}" : Id, _log);
    }

    /// <summary>A nested array, or null (reported when required).</summary>
    public JsonElement.ArrayEnumerator? Array(string field, bool required)
    {
        if (!TryGet(field, required, out var value) || IsNull(value, field, required))
        {
            return null;
        }

        if (value.ValueKind != JsonValueKind.Array)
        {
            Error(field, $"must be an array, got {Describe(value)}");
            return null;
        }

        return value.EnumerateArray();
    }

    /// <summary>True when the field is present (even as null).</summary>
    public bool Has(string field)
    {
        _asked.Add(field);
        return _element.TryGetProperty(field, out _);
    }

    /// <summary>The raw value of a field, for readers with their own shape (maps).</summary>
    public JsonElement? Raw(string field)
    {
        _asked.Add(field);
        return _element.TryGetProperty(field, out var value) ? value : null;
    }

    /// <summary>Warns about every field that no read asked for.</summary>
    public void WarnUnknownFields()
    {
        foreach (var property in _element.EnumerateObject())
        {
            if (!_asked.Contains(property.Name))
            {
                _log.Warning(Kind, Id, property.Name, "is not a known field and was ignored");
            }
        }
    }

    internal static string Describe(JsonElement value) => value.ValueKind switch
    {
        JsonValueKind.String => $"\"{value.GetString()}\"",
        JsonValueKind.Number => value.GetRawText(),
        JsonValueKind.True => "true",
        JsonValueKind.False => "false",
        JsonValueKind.Null => "null",
        JsonValueKind.Array => "an array",
        JsonValueKind.Object => "an object",
        _ => value.ValueKind.ToString(),
    };

    internal static string Format(double value) => value.ToString("G", CultureInfo.InvariantCulture);

    private bool TryGet(string field, bool required, out JsonElement value)
    {
        _asked.Add(field);
        if (_element.TryGetProperty(field, out value))
        {
            return true;
        }

        if (required)
        {
            Error(field, "is required");
        }

        return false;
    }

    private bool IsNull(JsonElement value, string field, bool required)
    {
        if (value.ValueKind != JsonValueKind.Null)
        {
            return false;
        }

        if (required)
        {
            Error(field, "is required, got null");
        }

        return true;
    }

    private string? String(string field, bool required)
    {
        if (!TryGet(field, required, out var value) || IsNull(value, field, required))
        {
            return null;
        }

        if (value.ValueKind != JsonValueKind.String)
        {
            Error(field, $"must be a string, got {Describe(value)}");
            return null;
        }

        var text = value.GetString()!;
        if (required && string.IsNullOrWhiteSpace(text))
        {
            Error(field, "must not be empty");
            return null;
        }

        return text;
    }

    private double? Number(string field, NumberRange range, bool required)
    {
        if (!TryGet(field, required, out var value) || IsNull(value, field, required))
        {
            return null;
        }

        if (value.ValueKind != JsonValueKind.Number || !value.TryGetDouble(out var number) || !double.IsFinite(number))
        {
            Error(field, $"must be a number, got {Describe(value)}");
            return null;
        }

        // -0 is 0: it must not pass the checks as zero and then fail a sign test later.
        number += 0.0;

        if (!range.Contains(number))
        {
            Error(field, $"must be {range}, got {Format(number)}");
            return null;
        }

        // No physical quantity of a distribution grid comes near this; beyond it sums overflow.
        if (Math.Abs(number) > MaximumMagnitude)
        {
            Error(field, $"must be at most {Format(MaximumMagnitude)} in magnitude, got {Format(number)}");
            return null;
        }

        return number;
    }

    private bool? Bool(string field, bool required)
    {
        if (!TryGet(field, required, out var value) || IsNull(value, field, required))
        {
            return null;
        }

        if (value.ValueKind is not (JsonValueKind.True or JsonValueKind.False))
        {
            Error(field, $"must be true or false, got {Describe(value)}");
            return null;
        }

        return value.GetBoolean();
    }
}

/// <summary>An allowed range of a number, with its own wording for messages.</summary>
internal readonly record struct NumberRange(double Low, bool LowOpen, double High, bool HighOpen)
{
    public static NumberRange Any => new(double.NegativeInfinity, true, double.PositiveInfinity, true);

    public static NumberRange Positive => new(0, true, double.PositiveInfinity, true);

    public static NumberRange AtLeast(double low) => new(low, false, double.PositiveInfinity, true);

    public static NumberRange Between(double low, double high) => new(low, false, high, false);

    public static NumberRange OpenBetween(double low, double high) => new(low, true, high, true);

    public bool Contains(double value) =>
        (LowOpen ? value > Low : value >= Low) && (HighOpen ? value < High : value <= High);

    public override string ToString()
    {
        var low = ElementReader.Format(Low);
        var high = ElementReader.Format(High);
        if (double.IsPositiveInfinity(High))
        {
            return LowOpen ? $"> {low}" : $">= {low}";
        }

        return (LowOpen ? $"> {low}" : $">= {low}") + " and " + (HighOpen ? $"< {high}" : $"<= {high}");
    }
}
