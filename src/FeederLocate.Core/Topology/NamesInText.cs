using System.Text.RegularExpressions;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Topology;

/// <summary>
/// Puts operators' names into a text written with ids: every section and segment id in it (a whole word:
/// "FPI-S108" is an indicator's name and stays) is replaced by the name people use. The page and the command
/// line's text both read names; the file formats and the API keep the ids.
/// </summary>
public static partial class NamesInText
{
    public static string With(string text, SectionNames? sections, SegmentNames? segments)
    {
        ArgumentNullException.ThrowIfNull(text);
        return sections is null && segments is null ? text : IdInText().Replace(text, m =>
        {
            if (sections is not null && sections.All.ContainsKey(new SectionId(m.Value)))
            {
                return sections[new SectionId(m.Value)];
            }

            return segments is not null && segments.All.ContainsKey(new SegmentId(m.Value)) ? segments[new SegmentId(m.Value)] : m.Value;
        });
    }

    /// <summary>A whole word that may be an id: letters, digits and _ . - inside, a letter, digit or _ at either end.</summary>
    [GeneratedRegex(@"(?<![A-Za-z0-9_.\-])[A-Za-z0-9_](?:[A-Za-z0-9_.\-]*[A-Za-z0-9_])?(?![A-Za-z0-9_\-]|\.[A-Za-z0-9_])")]
    private static partial Regex IdInText();
}
