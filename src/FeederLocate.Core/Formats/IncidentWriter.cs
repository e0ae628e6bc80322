using System.Globalization;
using System.Text;
using System.Text.Json;
using FeederLocate.Core.Evidence;

namespace FeederLocate.Core.Formats;

/// <summary>Writes an incident in the <c>feederlocate-incident/1</c> format; <see cref="IncidentReader"/> reads it back unchanged.</summary>
public static class IncidentWriter
{
    public static string Write(Incident incident)
    {
        ArgumentNullException.ThrowIfNull(incident);
        using var stream = new MemoryStream();
        using (var w = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true }))
        {
            w.WriteStartObject();
            w.WriteString("format", IncidentFormat.FormatTag);
            if (incident.GridReference is not null)
            {
                w.WriteString("grid", incident.GridReference);
            }

            w.WriteString("reportedAt", Time(incident.ReportedAt));
            w.WriteStartObject("switchStates");
            foreach (var (id, position) in incident.SwitchStates.OrderBy(p => p.Key.Value, StringComparer.Ordinal))
            {
                w.WriteString(id.Value, IncidentFormat.Name(position));
            }

            w.WriteEndObject();
            if (incident.TrippedDevice is { } tripped)
            {
                w.WriteString("trippedDevice", tripped.Value);
            }
            else
            {
                w.WriteNull("trippedDevice");
            }

            w.WriteString("faultType", IncidentFormat.Name(incident.FaultType));
            if (incident.ReenergisedAt is { } reenergisedAt)
            {
                w.WriteString("reenergisedAt", Time(reenergisedAt));
            }

            if (incident.FaultAt is { } faultAt)
            {
                w.WriteString("faultAt", Time(faultAt));
            }

            if (incident.Reclosing is { } reclosing)
            {
                w.WriteStartObject("reclosing");
                w.WriteString("device", reclosing.Device.Value);
                w.WriteNumber("attempts", reclosing.Attempts);
                w.WriteString("result", IncidentFormat.Name(reclosing.Result));
                w.WriteEndObject();
            }

            if (!incident.Fuses.IsEmpty)
            {
                w.WriteStartObject("fuses");
                foreach (var (id, condition) in incident.Fuses.OrderBy(p => p.Key.Value, StringComparer.Ordinal))
                {
                    w.WriteString(id.Value, IncidentFormat.Name(condition));
                }

                w.WriteEndObject();
            }

            if (!incident.Relays.IsDefaultOrEmpty)
            {
                w.WriteStartArray("relays");
                foreach (var relay in incident.Relays)
                {
                    w.WriteStartObject();
                    w.WriteString("device", relay.Device.Value);
                    if (relay.EarthFaultDirection is { } direction)
                    {
                        w.WriteString("earthFaultDirection", IncidentFormat.Name(direction));
                    }

                    Optional(w, "faultReactanceOhm", relay.FaultReactanceOhm);
                    w.WriteEndObject();
                }

                w.WriteEndArray();
            }

            w.WriteStartArray("measurements");
            foreach (var m in incident.Measurements)
            {
                w.WriteStartObject();
                w.WriteString("device", m.Device.Value);
                Optional(w, "phaseCurrentA", m.PhaseCurrentA);
                Optional(w, "residualCurrentA", m.ResidualCurrentA);
                Optional(w, "neutralVoltageV", m.NeutralVoltageV);
                w.WriteEndObject();
            }

            w.WriteEndArray();
            w.WriteStartArray("indications");
            foreach (var i in incident.Indications)
            {
                w.WriteStartObject();
                w.WriteString("indicator", i.Indicator.Value);
                w.WriteString("state", IncidentFormat.Name(i.State));
                w.WriteString("source", IncidentFormat.Name(i.Source));
                if (i.ReadAt is { } readAt)
                {
                    w.WriteString("readAt", Time(readAt));
                }

                if (i.Suspect)
                {
                    w.WriteBoolean("suspect", true);
                }

                w.WriteEndObject();
            }

            w.WriteEndArray();
            w.WriteEndObject();
        }

        return Encoding.UTF8.GetString(stream.ToArray()) + "\n";
    }

    private static string Time(DateTimeOffset time) =>
        time.ToUniversalTime().ToString("yyyy-MM-dd'T'HH:mm:ss.FFFFFFF'Z'", CultureInfo.InvariantCulture);

    private static void Optional(Utf8JsonWriter w, string name, double? value)
    {
        if (value is { } v)
        {
            w.WriteNumber(name, v);
        }
    }
}
