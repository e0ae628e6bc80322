using System.CommandLine;
using System.Globalization;
using FeederLocate.Application.Grids;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Comparison;
using FeederLocate.Storage.Grids;

namespace FeederLocate.Cli.Commands;

/// <summary>
/// Grid versions on the command line: <c>grid-diff BEFORE AFTER</c> compares two grid files element by element;
/// <c>grid-versions --db FILE [--grid NAME]</c> lists the versions stored in a database with who, when and why.
/// </summary>
internal static class GridCommands
{
    public static IEnumerable<Command> Create(CliConsole console)
    {
        yield return Diff(console);
        yield return Versions(console);
    }

    private static Command Diff(CliConsole console)
    {
        var before = new Argument<string>("BEFORE") { Description = "The earlier grid file (feederlocate-grid/1)" };
        var after = new Argument<string>("AFTER") { Description = "The later grid file (feederlocate-grid/1)" };
        var json = CliOptions.Json();
        var command = new Command("grid-diff", "Compare two grid files: elements added, removed and changed, by kind and id, with the changed fields") { before, after, json };
        command.SetAction(parse =>
        {
            var a = InputFiles.LoadGrid(parse.GetValue(before)!, console.Error);
            var b = InputFiles.LoadGrid(parse.GetValue(after)!, console.Error);
            var difference = GridVersions.Compare(a, b);
            if (parse.GetValue(json))
            {
                JsonOutput.Write(console.Out, Document(difference));
                return CliApp.Success;
            }

            if (difference.IsEmpty)
            {
                console.Out.WriteLine("no differences: the two grids hold the same elements with the same values");
                return CliApp.Success;
            }

            console.Out.WriteLine($"{difference.Added.Count()} added, {difference.Removed.Count()} removed, {difference.Changed.Count()} changed");
            var table = TableOutput.Table("element", "change", "field", "before", "after");
            foreach (var f in difference.GridFields)
            {
                table.AddRow("grid", "changed", f.Field, f.Before ?? "–", f.After ?? "–");
            }

            foreach (var e in difference.Elements)
            {
                var change = e.Change.ToString().ToLowerInvariant();
                if (e.Fields.IsEmpty)
                {
                    table.AddRow($"{e.Kind} {e.Id}", change, string.Empty, string.Empty, string.Empty);
                }

                foreach (var f in e.Fields)
                {
                    table.AddRow($"{e.Kind} {e.Id}", change, f.Field, f.Before ?? "–", f.After ?? "–");
                }
            }

            TableOutput.Write(console.Out, table);
            return CliApp.Success;
        });
        return command;
    }

    private static Command Versions(CliConsole console)
    {
        var db = CliOptions.Database(required: true);
        var grid = new Option<string?>("--grid") { Description = "Only this grid name" };
        var json = CliOptions.Json();
        var command = new Command("grid-versions", "List the grid versions stored in the database, with who loaded each, when and why") { db, grid, json };
        command.SetAction(parse =>
        {
            // Opened as an existing incident log first, so a missing file is bad input and nothing is created.
            var path = parse.GetValue(db)!;
            ExistingDatabase.Open(path).Dispose();
            using var store = GridVersionStore.Open(path);
            var names = parse.GetValue(grid) is { } only ? [only] : store.GridNames();
            var versions = names.SelectMany(store.Versions).ToList();
            if (parse.GetValue(json))
            {
                JsonOutput.Write(console.Out, versions.Select(v => new
                {
                    grid = v.GridName, version = v.Version, loadedAt = v.LoadedAt, loadedBy = v.LoadedBy.Name, role = v.LoadedBy.Role,
                    reason = v.Reason, source = v.Source, contentSha256 = v.ContentSha256,
                }));
                return CliApp.Success;
            }

            var table = TableOutput.Table("grid", "version", "loaded", "by", "reason", "file", "SHA-256");
            foreach (var v in versions)
            {
                table.AddRow(v.GridName, v.Version.ToString(CultureInfo.InvariantCulture), v.LoadedAt.ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture),
                    v.LoadedBy.ToString(), v.Reason ?? "–", v.Source ?? "–", v.ContentSha256[..12]);
            }

            TableOutput.Write(console.Out, table);
            return CliApp.Success;
        });
        return command;
    }

    internal sealed record FieldDocument(string Field, string? Before, string? After);

    internal sealed record ElementDocument(string Kind, string Id, string Change, IReadOnlyList<FieldDocument> Fields);

    internal sealed record DiffDocument(int Added, int Removed, int Changed, IReadOnlyList<FieldDocument> Grid, IReadOnlyList<ElementDocument> Elements);

    private static DiffDocument Document(GridDifference d) => new(
        d.Added.Count(), d.Removed.Count(), d.Changed.Count(),
        [.. d.GridFields.Select(f => new FieldDocument(f.Field, f.Before, f.After))],
        [.. d.Elements.Select(e => new ElementDocument(e.Kind, e.Id, e.Change.ToString().ToLowerInvariant(), [.. e.Fields.Select(f => new FieldDocument(f.Field, f.Before, f.After))]))]);
}
