using System.Collections.Immutable;
using System.Text.Json.Nodes;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Comparison;

/// <summary>
/// Compares two grids element by element in the grid format's own terms: both are written with
/// <see cref="GridWriter"/> and each collection's elements are matched by id, so field names and values are
/// those of the file an engineer reads.
/// </summary>
public static class GridComparison
{
    public static GridDifference Compare(Grid before, Grid after)
    {
        ArgumentNullException.ThrowIfNull(before);
        ArgumentNullException.ThrowIfNull(after);
        var a = JsonNode.Parse(GridWriter.Write(before))!.AsObject();
        var b = JsonNode.Parse(GridWriter.Write(after))!.AsObject();

        var gridFields = ImmutableArray.CreateBuilder<FieldChange>();
        foreach (var field in new[] { "name", "frequencyHz" })
        {
            Fields(field, a[field], b[field], gridFields);
        }

        var elements = ImmutableArray.CreateBuilder<ElementChange>();
        foreach (var collection in GridDifference.Collections)
        {
            var was = ById(a[collection]);
            var now = ById(b[collection]);
            foreach (var id in was.Keys.Union(now.Keys).Order(StringComparer.Ordinal))
            {
                var old = was.GetValueOrDefault(id);
                var @new = now.GetValueOrDefault(id);
                if (old is null)
                {
                    elements.Add(new ElementChange(collection, id, ElementChangeKind.Added, []));
                }
                else if (@new is null)
                {
                    elements.Add(new ElementChange(collection, id, ElementChangeKind.Removed, []));
                }
                else
                {
                    var fields = ImmutableArray.CreateBuilder<FieldChange>();
                    Fields(string.Empty, old, @new, fields);
                    if (fields.Count > 0)
                    {
                        elements.Add(new ElementChange(collection, id, ElementChangeKind.Changed, fields.ToImmutable()));
                    }
                }
            }
        }

        return new GridDifference(gridFields.ToImmutable(), elements.ToImmutable());
    }

    private static Dictionary<string, JsonObject> ById(JsonNode? collection)
    {
        var byId = new Dictionary<string, JsonObject>(StringComparer.Ordinal);
        foreach (var element in collection?.AsArray() ?? [])
        {
            if (element is JsonObject o && o["id"]?.GetValue<string>() is { } id)
            {
                byId[id] = o;
            }
        }

        return byId;
    }

    /// <summary>Adds every leaf field under <paramref name="path"/> whose value differs; objects are walked, arrays compared whole.</summary>
    private static void Fields(string path, JsonNode? before, JsonNode? after, ImmutableArray<FieldChange>.Builder changes)
    {
        if (before is JsonObject || after is JsonObject)
        {
            var was = before as JsonObject;
            var now = after as JsonObject;
            var names = (was?.Select(p => p.Key) ?? []).Union(now?.Select(p => p.Key) ?? []).Where(n => n != "id" || path.Length > 0);
            if (was is null || now is null)
            {
                changes.Add(new FieldChange(path, before?.ToJsonString(), after?.ToJsonString()));
                return;
            }

            foreach (var name in names.Order(StringComparer.Ordinal))
            {
                Fields(path.Length == 0 ? name : $"{path}.{name}", was[name], now[name], changes);
            }

            return;
        }

        if (!JsonNode.DeepEquals(before, after))
        {
            changes.Add(new FieldChange(path, Text(before), Text(after)));
        }
    }

    private static string? Text(JsonNode? value) =>
        value is JsonValue v && v.TryGetValue<string>(out var s) ? s : value?.ToJsonString();
}
