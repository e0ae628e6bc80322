// Opens the log at DB, prints "ready", waits for one line on standard input (so that several writers can be
// started together), then appends up to COUNT indication events to incident INCIDENT, one transaction each,
// printing each committed event's id on its own line as soon as it is committed.
// Usage: FeederLocate.Storage.Tests.Writer DB INCIDENT COUNT ACTOR
using System.Globalization;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

if (args.Length != 4
    || !long.TryParse(args[1], NumberStyles.None, CultureInfo.InvariantCulture, out var incidentNumber)
    || !int.TryParse(args[2], NumberStyles.None, CultureInfo.InvariantCulture, out var count))
{
    Console.Error.WriteLine("usage: FeederLocate.Storage.Tests.Writer DB INCIDENT COUNT ACTOR");
    return 2;
}

var incident = new IncidentId(incidentNumber);
var actor = new Actor(args[3], "system");
using var store = IncidentStore.Open(args[0]);
Console.Out.WriteLine("ready");
Console.Out.Flush();
_ = Console.In.ReadLine();
for (var i = 0; i < count; i++)
{
    var indication = new Indication(
        new IndicatorId($"FI{i % 7}"),
        i % 2 == 0 ? IndicatorState.Fault : IndicatorState.None,
        IndicationSource.Remote);
    var stored = store.Append(incident, new IndicationEntered(indication), actor);
    Console.Out.WriteLine(stored.Id.Value.ToString(CultureInfo.InvariantCulture));
    Console.Out.Flush();
}

return 0;
