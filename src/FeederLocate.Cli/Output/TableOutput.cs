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
        table.AddRow(cells.Select(c => (IRenderable)new Text(c)).ToArray());

    public static void Write(TextWriter writer, IRenderable renderable) => ConsoleFor(writer).Write(renderable);
}
