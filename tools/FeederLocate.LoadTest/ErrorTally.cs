namespace FeederLocate.LoadTest;

/// <summary>Failed requests counted by kind, for instance <c>POST indications: 500 InternalServerError</c>. One per client; merged at the end.</summary>
public sealed class ErrorTally
{
    private readonly SortedDictionary<string, int> _byKind = new(StringComparer.Ordinal);

    public int Total => _byKind.Values.Sum();

    public IReadOnlyDictionary<string, int> ByKind => _byKind;

    public void Add(string kind) => _byKind[kind] = _byKind.GetValueOrDefault(kind) + 1;

    public static ErrorTally Merge(IEnumerable<ErrorTally> tallies)
    {
        ArgumentNullException.ThrowIfNull(tallies);
        var merged = new ErrorTally();
        foreach (var (kind, count) in tallies.SelectMany(t => t._byKind))
        {
            merged._byKind[kind] = merged._byKind.GetValueOrDefault(kind) + count;
        }

        return merged;
    }
}
