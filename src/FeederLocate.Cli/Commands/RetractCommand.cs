using System.CommandLine;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Evidence;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Cli.Commands;

/// <summary>
/// <c>retract --db FILE --incident ID --reason TEXT --by ENGINEER</c>: withdraws a wrong outcome with a logged
/// retraction event. The outcome stays in the log; from then on the incident has none and the learning leaves it out.
/// </summary>
internal static class RetractCommand
{
    public static Command Create(CliConsole console)
    {
        var db = CliOptions.Database(required: true);
        var incident = new Option<long>("--incident") { Description = "The logged incident whose outcome was wrong", Required = true };
        var reason = new Option<string>("--reason")
        {
            Description = $"Why the outcome is withdrawn (at most {EvidenceLimits.MaxCauseChars} characters)", Required = true,
        };
        var by = new Option<string>("--by")
        {
            Description = $"The engineer retracting it, proven by one of the account's API tokens in the environment variable {ProvenAccount.TokenVariable}",
            Required = true,
        };
        var json = CliOptions.Json();
        var command = new Command("retract", "Withdraw a wrong outcome with a logged retraction (engineers only); the next ranking no longer learns from it")
        {
            db, incident, reason, by, json,
        };
        command.SetAction(parse => Run(console, parse.GetValue(db)!, parse.GetValue(incident), parse.GetValue(reason)!, parse.GetValue(by)!, parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string dbPath, long incidentId, string reason, string by, bool json)
    {
        if (string.IsNullOrWhiteSpace(reason))
        {
            throw new BadInputException("error: --reason must say why the outcome is withdrawn");
        }

        if (reason.Length > EvidenceLimits.MaxCauseChars)
        {
            throw new BadInputException($"error: --reason holds {reason.Length} characters; at most {EvidenceLimits.MaxCauseChars} are accepted");
        }

        using var log = HistoryDatabase.OpenExistingLog(dbPath);
        var actor = ProvenAccount.Of(dbPath, by, AccountRole.Engineer, "retracting an outcome");
        var id = new IncidentId(incidentId);
        string? withdrawn;
        try
        {
            withdrawn = log.State(id).Outcome?.Outcome.ConfirmedSegment.Value;
            log.Append(id, new OutcomeRetracted(reason.Trim()), actor);
        }
        catch (UnknownIncidentException)
        {
            throw new BadInputException($"error: --incident {incidentId} is not an incident of {dbPath}");
        }
        catch (IncidentStoreException e)
        {
            throw new BadInputException($"error: {e.Message}");
        }

        if (json)
        {
            JsonOutput.Write(console.Out, new { incidentId, retractedSegment = withdrawn, by = actor.Name });
        }
        else
        {
            console.Out.WriteLine($"retracted the outcome of incident {incidentId} (fault on {withdrawn}) as {actor.Name}: the learning no longer uses it");
        }

        return CliApp.Success;
    }
}
