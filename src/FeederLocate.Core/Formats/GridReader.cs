using System.Collections.Immutable;
using System.Text.Json;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Formats;

/// <summary>
/// Reads a grid file (<c>feederlocate-grid/1</c>) and checks it whole: every problem is reported with
/// its element and field, and no grid is built while any error remains.
/// </summary>
public static class GridReader
{
    private const string GridKind = "grid";

    /// <summary>Reads and checks grid JSON text. Never throws for bad data.</summary>
    public static LoadResult<Grid> Parse(string json)
    {
        try
        {
            return Read(json);
        }
        catch (InvalidOperationException e) when (e.Message.Contains("UTF", StringComparison.OrdinalIgnoreCase) || e.Message.Contains("surrogate", StringComparison.OrdinalIgnoreCase) || e.InnerException is System.Text.DecoderFallbackException)
        {
            return new LoadResult<Grid>(null, [NotText(GridKind)]);
        }
        catch (ArgumentException)
        {
            return new LoadResult<Grid>(null, [NotText(GridKind)]);
        }
    }

    internal static ValidationIssue NotText(string kind) =>
        new(Severity.Error, kind, "file", string.Empty, "holds a string that is not valid Unicode text (an escaped lone surrogate such as \\uD800)");

    private static LoadResult<Grid> Read(string json)
    {
        var log = new IssueLog();
        using var document = JsonText.Parse(json, GridKind, log);
        if (document is null)
        {
            return new LoadResult<Grid>(null, log.Issues);
        }

        var root = new ElementReader(document.RootElement, GridKind, "file", log);
        var format = root.RequiredString("format");
        if (format is not null && format != GridFormat.FormatTag)
        {
            root.Error("format", $"must be \"{GridFormat.FormatTag}\", got \"{format}\"");
            return new LoadResult<Grid>(null, log.Issues);
        }

        var name = root.RequiredString("name") ?? string.Empty;
        var frequencyHz = root.RequiredNumber("frequencyHz", NumberRange.Positive);
        if (frequencyHz is not null and not (50 or 60))
        {
            root.Error("frequencyHz", $"must be 50 or 60, got {ElementReader.Format(frequencyHz.Value)}");
        }

        var parts = new GridParts(
            Items(root, "lineTypes", "lineType", log, ReadLineType),
            Items(root, "substations", "substation", log, ReadSubstation),
            Items(root, "nodes", "node", log, ReadNode),
            Items(root, "segments", "segment", log, ReadSegment),
            Items(root, "switches", "switch", log, ReadSwitch),
            Items(root, "indicators", "indicator", log, ReadIndicator),
            Items(root, "crews", "crewBase", log, ReadCrewBase, required: false));
        root.WarnUnknownFields();

        GridChecks.Run(parts, log);
        if (log.HasErrors)
        {
            return new LoadResult<Grid>(null, log.Issues);
        }

        var grid = Grid.Create(name, frequencyHz!.Value, parts.LineTypes, parts.Substations, parts.Nodes,
            parts.Segments, parts.Switches, parts.Indicators).WithCrewBases(parts.CrewBases);
        GridChecks.NormalTopology(grid, log);
        return new LoadResult<Grid>(log.HasErrors ? null : grid, log.Issues);
    }

    private static List<T> Items<T>(ElementReader root, string field, string kind, IssueLog log, Func<ElementReader, T> read, bool required = true)
    {
        var items = new List<T>();
        if (root.Array(field, required) is not { } array)
        {
            return items;
        }

        var index = 0;
        foreach (var item in array)
        {
            if (ElementReader.ForItem(item, kind, index++, log) is { } reader)
            {
                // A missing id is reported; the element is still read so its other fields are checked too.
                _ = reader.RequiredString("id");

                items.Add(read(reader));
                reader.WarnUnknownFields();
            }
        }

        return items;
    }

    private static LineType ReadLineType(ElementReader r)
    {
        var construction = GridFormat.Choice(r, "construction", GridFormat.Constructions) ?? Construction.Cable;
        return new LineType(
            new LineTypeId(r.Id),
            construction,
            r.RequiredNumber("r1OhmPerKm", NumberRange.AtLeast(0)) ?? double.NaN,
            r.RequiredNumber("x1OhmPerKm", NumberRange.AtLeast(0)) ?? double.NaN,
            r.RequiredNumber("r0OhmPerKm", NumberRange.AtLeast(0)) ?? double.NaN,
            r.RequiredNumber("x0OhmPerKm", NumberRange.AtLeast(0)) ?? double.NaN,
            r.RequiredNumber("c0NfPerKm", NumberRange.AtLeast(0)) ?? double.NaN,
            r.RequiredNumber("ampacityA", NumberRange.Positive) ?? double.NaN,
            r.OptionalNumber("faultsPer100KmYear", NumberRange.AtLeast(0)),
            r.OptionalString("description"),
            r.OptionalString("conductorMaterial"),
            r.OptionalNumber("crossSectionMm2", NumberRange.Positive),
            r.OptionalString("dataSource"));
    }

    private static Substation ReadSubstation(ElementReader r)
    {
        var busNode = r.RequiredString("busNode") ?? string.Empty;
        var nominalVoltageKv = r.RequiredNumber("nominalVoltageKv", NumberRange.Positive) ?? double.NaN;
        var supply = ReadSupply(r);
        ImpedanceOhm? z0 = null;
        if (r.Object("transformerZ0Ohm", required: false) is { } z0Reader)
        {
            z0 = new ImpedanceOhm(
                z0Reader.RequiredNumber("r", NumberRange.AtLeast(0)) ?? double.NaN,
                z0Reader.RequiredNumber("x", NumberRange.AtLeast(0)) ?? double.NaN);
            z0Reader.WarnUnknownFields();
        }

        if (z0 is { ResistanceOhm: 0, ReactanceOhm: 0 })
        {
            r.Error("transformerZ0Ohm", "must not be 0 + j0 Ω: the transformer's zero-sequence path has an impedance");
        }

        var ratedMva = r.OptionalNumber("transformerRatedMva", NumberRange.Positive);
        var grounding = ReadGrounding(r, z0 is not null);
        return new Substation(new SubstationId(r.Id), new NodeId(busNode), nominalVoltageKv, supply, z0, ratedMva, grounding);
    }

    private static SourceSupply ReadSupply(ElementReader r)
    {
        var atBusbar = r.Has("shortCircuitMva") || r.Has("rOverX");
        var upstream = r.Has("upstream") || r.Has("transformer");
        if (atBusbar && upstream)
        {
            r.Error("shortCircuitMva", "and upstream/transformer are two ways to give the supply: give one, not both");
        }

        if (upstream)
        {
            var u = r.Object("upstream", required: true);
            var t = r.Object("transformer", required: true);
            var network = new UpstreamNetwork(
                u?.RequiredNumber("nominalVoltageKv", NumberRange.Positive) ?? double.NaN,
                u?.RequiredNumber("shortCircuitMva", NumberRange.Positive) ?? double.NaN,
                u?.RequiredNumber("rOverX", NumberRange.AtLeast(0)) ?? double.NaN);
            var transformer = new TransformerData(
                t?.RequiredNumber("ratedMva", NumberRange.Positive) ?? double.NaN,
                t?.RequiredNumber("hvKv", NumberRange.Positive) ?? double.NaN,
                t?.RequiredNumber("mvKv", NumberRange.Positive) ?? double.NaN,
                t?.RequiredNumber("ukrPercent", NumberRange.OpenBetween(0, 100)) ?? double.NaN,
                t?.RequiredNumber("pkrKw", NumberRange.AtLeast(0)) ?? double.NaN);
            u?.WarnUnknownFields();
            t?.WarnUnknownFields();
            if (t is not null && double.IsFinite(transformer.RatedMva) && double.IsFinite(transformer.UkrPercent)
                && double.IsFinite(transformer.PkrKw) && transformer.PkrKw / 1000 >= transformer.UkrPercent / 100 * transformer.RatedMva)
            {
                t.Error("pkrKw", $"must be below ukr·Sr = {ElementReader.Format(transformer.UkrPercent / 100 * transformer.RatedMva * 1000)} kW (the losses cannot exceed the short-circuit power), got {ElementReader.Format(transformer.PkrKw)}");
            }

            return new UpstreamViaTransformer(network, transformer);
        }

        return new BusbarShortCircuit(
            r.RequiredNumber("shortCircuitMva", NumberRange.Positive) ?? double.NaN,
            r.RequiredNumber("rOverX", NumberRange.AtLeast(0)) ?? double.NaN);
    }

    private static Grounding ReadGrounding(ElementReader substation, bool hasTransformerZ0)
    {
        var g = substation.Object("grounding", required: true);
        if (g is null)
        {
            return new Grounding(GroundingScheme.Isolated);
        }

        var scheme = GridFormat.Choice(g, "scheme", GridFormat.Schemes);
        var detuning = g.OptionalNumber("detuningPercent", NumberRange.OpenBetween(-100, 100));
        var damping = g.OptionalNumber("dampingPercent", NumberRange.Between(0, 100));
        var resistance = g.OptionalNumber("neutralResistanceOhm", NumberRange.AtLeast(0));
        var reactance = g.OptionalNumber("neutralReactanceOhm", NumberRange.AtLeast(0));
        g.WarnUnknownFields();
        var name = scheme is { } s ? GridFormat.Name(s) : string.Empty;
        void Require(string field, bool present, string purpose)
        {
            if (!present)
            {
                g.Error(field, $"is required for the {name} scheme ({purpose})");
            }
        }

        switch (scheme)
        {
            case GroundingScheme.Resonant:
                Require("detuningPercent", g.Has("detuningPercent"), "coil tuning");
                Require("dampingPercent", g.Has("dampingPercent"), "active residual current");
                break;
            case GroundingScheme.Impedance:
                Require("neutralResistanceOhm", g.Has("neutralResistanceOhm"), "neutral resistor");
                if (resistance == 0 && (reactance ?? 0) == 0)
                {
                    g.Error("neutralResistanceOhm", "and neutralReactanceOhm are both 0: that is the solid scheme");
                }

                break;
        }

        if (scheme is GroundingScheme.Solid or GroundingScheme.Impedance && !hasTransformerZ0)
        {
            substation.Error("transformerZ0Ohm", $"is required for the {name} scheme (zero-sequence path through the transformer)");
        }

        return new Grounding(scheme ?? GroundingScheme.Isolated, detuning ?? 0, damping ?? 0, resistance ?? 0, reactance ?? 0);
    }

    private static Node ReadNode(ElementReader r) => new(
        new NodeId(r.Id),
        r.OptionalNumber("loadKw", NumberRange.AtLeast(0)) ?? 0,
        r.OptionalNumber("loadKvar", NumberRange.Any),
        r.OptionalCount("customers") ?? 0,
        r.OptionalNumber("x", NumberRange.Any),
        r.OptionalNumber("y", NumberRange.Any));

    private static Segment ReadSegment(ElementReader r) => new(
        new SegmentId(r.Id),
        new NodeId(r.RequiredString("from") ?? string.Empty),
        new NodeId(r.RequiredString("to") ?? string.Empty),
        new LineTypeId(r.RequiredString("lineType") ?? string.Empty),
        r.RequiredNumber("lengthKm", NumberRange.Positive) ?? double.NaN);

    private static SwitchingDevice ReadSwitch(ElementReader r)
    {
        var device = new SwitchingDevice(
            new SwitchId(r.Id),
            new NodeId(r.RequiredString("from") ?? string.Empty),
            new NodeId(r.RequiredString("to") ?? string.Empty),
            GridFormat.Choice(r, "kind", GridFormat.SwitchKinds) ?? SwitchKind.Disconnector,
            r.RequiredBool("normallyOpen") ?? false,
            r.RequiredBool("remote") ?? false,
            Units.Duration(r.OptionalNumber("travelMinutes", NumberRange.Between(0, Units.LongestDurationMinutes))),
            r.OptionalNumber("ratedCurrentA", NumberRange.Positive));
        if (device.RatedCurrentA is not null && device.Kind != SwitchKind.Fuse)
        {
            r.Error("ratedCurrentA", $"is given for fuses only; {r.Id} is a {GridFormat.Name(device.Kind)}");
        }

        return device;
    }

    private static CrewBase ReadCrewBase(ElementReader r)
    {
        var node = r.RequiredString("node") ?? string.Empty;
        var count = r.RequiredNumber("count", NumberRange.Between(1, 1000));
        if (count is { } c && c != Math.Floor(c))
        {
            r.Error("count", $"must be a whole number of crews, got {ElementReader.Format(c)}");
        }

        var times = ImmutableDictionary.CreateBuilder<SwitchId, TimeSpan>();
        if (r.Raw("travelMinutes") is { ValueKind: JsonValueKind.Object } raw && r.Object("travelMinutes", required: false) is { } map)
        {
            foreach (var device in raw.EnumerateObject())
            {
                if (map.RequiredNumber(device.Name, NumberRange.Between(0, Units.LongestDurationMinutes)) is { } minutes)
                {
                    times[new SwitchId(device.Name)] = Units.Duration(minutes)!.Value;
                }
            }
        }
        else if (r.Has("travelMinutes"))
        {
            _ = r.Object("travelMinutes", required: false);
        }

        return new CrewBase(new CrewBaseId(r.Id), new NodeId(node), count is { } n && n == Math.Floor(n) ? (int)n : 0,
            r.OptionalString("name"), times.Count > 0 ? times.ToImmutable() : null);
    }

    private static Indicator ReadIndicator(ElementReader r)
    {
        var indicator = new Indicator(
            new IndicatorId(r.Id),
            new SegmentId(r.RequiredString("segment") ?? string.Empty),
            new NodeId(r.RequiredString("node") ?? string.Empty),
            r.OptionalNumber("phasePickupA", NumberRange.Positive),
            r.OptionalNumber("earthPickupA", NumberRange.Positive),
            r.RequiredBool("directional") ?? false,
            r.RequiredBool("remote") ?? false,
            Units.Duration(r.OptionalNumber("resetMinutes", NumberRange.Between(Units.ShortestResetMinutes, Units.LongestDurationMinutes))));
        if (indicator.PhasePickupA is null && indicator.EarthPickupA is null)
        {
            r.Error("phasePickupA", "or earthPickupA is required: an indicator needs at least one element");
        }

        return indicator;
    }
}

/// <summary>The elements as read, before they are checked against each other.</summary>
internal sealed record GridParts(
    List<LineType> LineTypes,
    List<Substation> Substations,
    List<Node> Nodes,
    List<Segment> Segments,
    List<SwitchingDevice> Switches,
    List<Indicator> Indicators,
    List<CrewBase> CrewBases);
