using System.Text;
using System.Text.Json;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Formats;

/// <summary>Writes a grid in the <c>feederlocate-grid/1</c> format; <see cref="GridReader"/> reads it back unchanged.</summary>
public static class GridWriter
{
    public static string Write(Grid grid)
    {
        ArgumentNullException.ThrowIfNull(grid);
        using var stream = new MemoryStream();
        using (var w = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true }))
        {
            w.WriteStartObject();
            w.WriteString("format", GridFormat.FormatTag);
            w.WriteString("name", grid.Name);
            Number(w, "frequencyHz", grid.FrequencyHz);
            Array(w, "lineTypes", grid.LineTypes, WriteLineType);
            Array(w, "substations", grid.Substations, WriteSubstation);
            Array(w, "nodes", grid.Nodes, WriteNode);
            Array(w, "segments", grid.Segments, (w, s) =>
            {
                w.WriteString("id", s.Id.Value);
                w.WriteString("from", s.From.Value);
                w.WriteString("to", s.To.Value);
                w.WriteString("lineType", s.LineType.Value);
                Number(w, "lengthKm", s.LengthKm);
            });
            Array(w, "switches", grid.Switches, (w, s) =>
            {
                w.WriteString("id", s.Id.Value);
                w.WriteString("from", s.From.Value);
                w.WriteString("to", s.To.Value);
                w.WriteString("kind", GridFormat.Name(s.Kind));
                w.WriteBoolean("normallyOpen", s.NormallyOpen);
                w.WriteBoolean("remote", s.Remote);
                Optional(w, "travelMinutes", Units.Minutes(s.TravelTime));
                Optional(w, "ratedCurrentA", s.RatedCurrentA);
            });
            Array(w, "indicators", grid.Indicators, (w, i) =>
            {
                w.WriteString("id", i.Id.Value);
                w.WriteString("segment", i.Segment.Value);
                w.WriteString("node", i.Node.Value);
                Optional(w, "phasePickupA", i.PhasePickupA);
                Optional(w, "earthPickupA", i.EarthPickupA);
                w.WriteBoolean("directional", i.Directional);
                w.WriteBoolean("remote", i.Remote);
                Optional(w, "resetMinutes", Units.Minutes(i.ResetTime));
            });
            if (!grid.CrewBases.IsEmpty)
            {
                Array(w, "crews", grid.CrewBases, WriteCrewBase);
            }

            w.WriteEndObject();
        }

        return Encoding.UTF8.GetString(stream.ToArray()) + "\n";
    }

    private static void WriteLineType(Utf8JsonWriter w, LineType t)
    {
        w.WriteString("id", t.Id.Value);
        w.WriteString("construction", GridFormat.Name(t.Construction));
        Number(w, "r1OhmPerKm", t.R1OhmPerKm);
        Number(w, "x1OhmPerKm", t.X1OhmPerKm);
        Number(w, "r0OhmPerKm", t.R0OhmPerKm);
        Number(w, "x0OhmPerKm", t.X0OhmPerKm);
        Number(w, "c0NfPerKm", t.C0NfPerKm);
        Number(w, "ampacityA", t.AmpacityA);
        Optional(w, "faultsPer100KmYear", t.FaultsPer100KmYear);
        Optional(w, "description", t.Description);
        Optional(w, "conductorMaterial", t.ConductorMaterial);
        Optional(w, "crossSectionMm2", t.CrossSectionMm2);
        Optional(w, "dataSource", t.DataSource);
    }

    private static void WriteSubstation(Utf8JsonWriter w, Substation s)
    {
        w.WriteString("id", s.Id.Value);
        w.WriteString("busNode", s.BusNode.Value);
        Number(w, "nominalVoltageKv", s.NominalVoltageKv);
        switch (s.Supply)
        {
            case BusbarShortCircuit b:
                Number(w, "shortCircuitMva", b.ShortCircuitMva);
                Number(w, "rOverX", b.ROverX);
                break;
            case UpstreamViaTransformer u:
                w.WriteStartObject("upstream");
                Number(w, "nominalVoltageKv", u.Upstream.NominalVoltageKv);
                Number(w, "shortCircuitMva", u.Upstream.ShortCircuitMva);
                Number(w, "rOverX", u.Upstream.ROverX);
                w.WriteEndObject();
                w.WriteStartObject("transformer");
                Number(w, "ratedMva", u.Transformer.RatedMva);
                Number(w, "hvKv", u.Transformer.HvKv);
                Number(w, "mvKv", u.Transformer.MvKv);
                Number(w, "ukrPercent", u.Transformer.UkrPercent);
                Number(w, "pkrKw", u.Transformer.PkrKw);
                w.WriteEndObject();
                break;
        }

        if (s.TransformerZ0Ohm is { } z0)
        {
            w.WriteStartObject("transformerZ0Ohm");
            Number(w, "r", z0.ResistanceOhm);
            Number(w, "x", z0.ReactanceOhm);
            w.WriteEndObject();
        }

        Optional(w, "transformerRatedMva", s.TransformerRatedMva);
        var g = s.Grounding;
        w.WriteStartObject("grounding");
        w.WriteString("scheme", GridFormat.Name(g.Scheme));
        // Every parameter that is set is written, whatever the scheme, so a round trip changes nothing.
        if (g.Scheme == GroundingScheme.Resonant || g.DetuningPercent != 0)
        {
            Number(w, "detuningPercent", g.DetuningPercent);
        }

        if (g.Scheme == GroundingScheme.Resonant || g.DampingPercent != 0)
        {
            Number(w, "dampingPercent", g.DampingPercent);
        }

        if (g.Scheme == GroundingScheme.Impedance || g.NeutralResistanceOhm != 0)
        {
            Number(w, "neutralResistanceOhm", g.NeutralResistanceOhm);
        }

        if (g.NeutralReactanceOhm != 0)
        {
            Number(w, "neutralReactanceOhm", g.NeutralReactanceOhm);
        }

        w.WriteEndObject();
    }

    private static void WriteCrewBase(Utf8JsonWriter w, CrewBase b)
    {
        w.WriteString("id", b.Id.Value);
        Optional(w, "name", b.Name);
        w.WriteString("node", b.Node.Value);
        Number(w, "count", b.Count);
        if (b.TravelTimes is { Count: > 0 } times)
        {
            w.WriteStartObject("travelMinutes");
            foreach (var (device, time) in times.OrderBy(t => t.Key.Value, StringComparer.Ordinal))
            {
                Number(w, device.Value, Units.Minutes(time)!.Value);
            }

            w.WriteEndObject();
        }
    }

    private static void WriteNode(Utf8JsonWriter w, Node n)
    {
        w.WriteString("id", n.Id.Value);
        if (n.LoadKw != 0)
        {
            Number(w, "loadKw", n.LoadKw);
        }

        Optional(w, "loadKvar", n.LoadKvar);
        if (n.Customers != 0)
        {
            Number(w, "customers", n.Customers);
        }

        Optional(w, "x", n.X);
        Optional(w, "y", n.Y);
    }

    private static void Array<T>(Utf8JsonWriter w, string name, IEnumerable<T> items, Action<Utf8JsonWriter, T> write)
    {
        w.WriteStartArray(name);
        foreach (var item in items)
        {
            w.WriteStartObject();
            write(w, item);
            w.WriteEndObject();
        }

        w.WriteEndArray();
    }

    /// <summary>Writes a number, −0 as 0, so what is written reads back and writes again the same.</summary>
    private static void Number(Utf8JsonWriter w, string name, double value) => w.WriteNumber(name, value + 0.0);

    private static void Optional(Utf8JsonWriter w, string name, double? value)
    {
        if (value is { } v)
        {
            Number(w, name, v);
        }
    }

    private static void Optional(Utf8JsonWriter w, string name, string? value)
    {
        if (value is not null)
        {
            w.WriteString(name, value);
        }
    }
}
