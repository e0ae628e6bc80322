using System.Text.RegularExpressions;

namespace FeederLocate.Web.Tests.StaticFiles;

/// <summary>
/// wwwroot/lib/MANIFEST names each vendored browser library with its version and licence; the version
/// must be the one the file's own header comment states, so an update cannot leave the manifest behind.
/// </summary>
public partial class VendoredLibraryTests
{
    private static readonly string Lib = RepositoryFiles.Path("wwwroot", "lib");

    public static TheoryData<string, string, string, string> Entries()
    {
        var data = new TheoryData<string, string, string, string>();
        foreach (var line in File.ReadAllLines(Path.Combine(Lib, "MANIFEST")))
        {
            if (line.Length == 0 || line.StartsWith('#'))
            {
                continue;
            }

            var fields = line.Split(' ', StringSplitOptions.RemoveEmptyEntries);
            Assert.True(fields.Length == 4, $"MANIFEST line \"{line}\": expected file, version, licence, licence file");
            data.Add(fields[0], fields[1], fields[2], fields[3]);
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(Entries))]
    public void Manifest_version_is_the_one_in_the_file_header(string file, string version, string licence, string licenceFile)
    {
        var text = File.ReadAllText(Path.Combine(Lib, file));
        var header = HeaderComment().Match(text);
        Assert.True(header.Success, $"{file} starts with no /*! ... */ header comment");
        var stated = HeaderVersion().Match(header.Value);
        Assert.True(stated.Success, $"{file}: no version in its header comment");
        Assert.Equal(version, stated.Groups["version"].Value);
        Assert.Contains($"{licence} License", header.Value, StringComparison.Ordinal);
        Assert.Contains($"{licence} License", File.ReadAllText(Path.Combine(Lib, licenceFile)), StringComparison.Ordinal);
    }

    [Fact]
    public void Every_vendored_script_has_a_manifest_line()
    {
        var listed = Entries().Select(row => (string)row[0]).ToHashSet(StringComparer.Ordinal);
        var scripts = Directory.GetFiles(Lib, "*.js", SearchOption.AllDirectories)
            .Select(path => Path.GetRelativePath(Lib, path).Replace('\\', '/'))
            .ToList();

        Assert.NotEmpty(scripts);
        Assert.All(scripts, script => Assert.Contains(script, listed));
    }

    [GeneratedRegex(@"\A\s*/\*!.*?\*/", RegexOptions.Singleline)]
    private static partial Regex HeaderComment();

    [GeneratedRegex(@"\bv(?<version>\d+\.\d+\.\d+)\b")]
    private static partial Regex HeaderVersion();
}
