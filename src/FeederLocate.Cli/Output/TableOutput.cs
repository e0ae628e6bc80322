using Spectre.Console;
using Spectre.Console.Rendering;

namespace FeederLocate.Cli.Output;

/// <summary>Plain-text tables for people, drawn by Spectre.Console onto any writer (no colour, no escape codes).</summary>
public static class TableOutput
{
    public static IAnsiConsole ConsoleFor(TextWriter writer)
    {
        var console = AnsiConsole.Create(new AnsiConsoleSettings
        {
            Ansi = AnsiSupport.No,
            ColorSystem = ColorSystemSupport.NoColors,
            Interactive = InteractionSupport.No,
            Out = new AnsiConsoleOutput(writer),
        });
        console.Profile.Width = 160;
        return console;
    }

    public static Table Table(params string[] headers)
    {
        var table = new Table().Border(TableBorder.Simple);
        foreach (var header in headers)
        {
            table.AddColumn(new TableColumn(Markup.Escape(header)));
        }

        return table;
    }

    public static void AddRow(this Table table, params string[] cells) =>
        table.AddRow(cells.Select(c => (IRenderable)new Text(Printable(c))).ToArray());

    /// <summary>
    /// The text with control characters (but the line break, which starts a new line in the cell) and Unicode
    /// noncharacters written as <c>\uXXXX</c>: an id may hold any character the JSON allows, but the table's
    /// width measure fails on some of them (U+FFFF).
    /// </summary>
    public static string Printable(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        if (!text.Any(NeedsEscape))
        {
            return text;
        }

        var builder = new System.Text.StringBuilder(text.Length + 8);
        foreach (var c in text)
        {
            builder.Append(NeedsEscape(c) ? $"\\u{(int)c:X4}" : c.ToString());
        }

        return builder.ToString();
    }

    private static bool NeedsEscape(char c) =>
        (char.IsControl(c) && c != '\n') || c is '\uFFFE' or '\uFFFF' || c is >= '\uFDD0' and <= '\uFDEF';

    public static void Write(TextWriter writer, IRenderable renderable) => ConsoleFor(writer).Write(renderable);
}
