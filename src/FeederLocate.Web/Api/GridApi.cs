using System.Security.Claims;
using FeederLocate.Application.Grids;
using FeederLocate.Core.Comparison;
using FeederLocate.Storage.Grids;
using FeederLocate.Storage.Incidents;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;

namespace FeederLocate.Web.Api;

/// <summary>
/// Grid versions over HTTP, with the page's rules (<see cref="GridVersions"/>, <see cref="IncidentGridMove"/>): the
/// versions of a grid with who, when and why; the differences between two versions; loading a grid file (engineers;
/// a stored name with other content is a 409 until <c>replace=true</c> and a <c>reason</c> are given); the version an
/// incident is pinned to, and an engineer's move to another version with a reason (a refusal is a 422).
/// </summary>
internal static class GridApi
{
    public static void MapGridApi(this RouteGroupBuilder api)
    {
        api.MapGet("/grids/{name}/versions", (string name, ClaimsPrincipal user, GridCatalog grids) =>
            Visible(user, grids, name) is { } missing ? missing : Results.Ok(grids.Versions.Versions(name).Select(VersionEntry.Of)));
        api.MapGet("/grids/{name}/diff", (string name, int? from, int? to, ClaimsPrincipal user, GridCatalog grids) =>
        {
            if (Visible(user, grids, name) is { } missing)
            {
                return missing;
            }

            return from is not { } a || to is not { } b
                ? Results.BadRequest(ApiError.Single("bad comparison", "request", "query", from is null ? "from" : "to", "must give the two version numbers, from and to"))
                : grids.Versions.Compare(name, a, b) is { } difference
                    ? Results.Ok(DifferenceDocument.Of(a, b, difference))
                    : Results.NotFound(ApiError.Single("unknown version", "grid", name, "version", $"grid \"{name}\" has versions {string.Join(", ", grids.Versions.Versions(name).Select(v => v.Version))}; got {a} and {b}"));
        });
        api.MapPost("/grids", LoadGrid).RequireAuthorization(AccessPolicies.ApiEngineer);
        api.MapGet("/incidents/{id:long}/grid", (long id, ClaimsPrincipal user, IncidentBoard board, GridCatalog grids) =>
            IncidentApi.WithIncident(board, user, id, state => Results.Ok(PinDocument.Of(state, grids))));
        api.MapPost("/incidents/{id:long}/grid", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, IncidentGridMove move) =>
            SwitchingApi.WithBody<MoveBody>(id, user, request, board, grids, "grid move", (_, body) => Task.FromResult(body.Version is not { } version
                ? SwitchingApi.Bad("grid move", "version", "must give the version number to move to")
                : SwitchingApi.Answer(id, "incident", IncidentApi.Text(id), move.Move(new IncidentId(id), version, body.Reason, AccountClaims.ActorOf(user))))))
            .RequireAuthorization(AccessPolicies.ApiWrite);
    }

    private static IResult? Visible(ClaimsPrincipal user, GridCatalog grids, string name) =>
        AccountClaims.MaySee(user, name) && grids.Find(name) is not null
            ? null
            : Results.NotFound(ApiError.Single("unknown grid", "grid", name, "name", $"must name a stored grid of this account, got \"{name}\""));

    private static async Task<IResult> LoadGrid(HttpRequest request, ClaimsPrincipal user, bool? replace, string? reason, string? file, GridCatalog grids)
    {
        if (await IncidentApi.ReadBody(request) is not { } text)
        {
            return IncidentApi.TooLarge();
        }

        var load = grids.Load(file ?? "upload.grid.json", text, AccountClaims.ActorOf(user), replace ?? false, reason);
        if (load.GridName is { } name && !AccountClaims.MaySee(user, name))
        {
            return Results.NotFound(ApiError.Single("unknown grid", "grid", name, "name", "is not a grid of this account"));
        }

        return load.Outcome switch
        {
            GridLoadOutcome.Stored => Results.Created($"/api/grids/{Uri.EscapeDataString(load.GridName!)}/versions", LoadDocument.Of(load)),
            GridLoadOutcome.Unchanged => Results.Ok(LoadDocument.Of(load)),
            GridLoadOutcome.NeedsConfirmation => Results.Conflict(LoadDocument.Of(load)),
            _ when load.Issues.Count > 0 => Results.BadRequest(ApiError.From("the grid file has errors", load.Issues)),
            _ => Results.UnprocessableEntity(ApiError.Single("refused", "grid", "file", "body", load.Refusal ?? "not stored")),
        };
    }

    public sealed record MoveBody(int? Version, string? Reason);

    public sealed record VersionEntry(string Grid, int Version, DateTimeOffset LoadedAt, string LoadedBy, string? Role, string? Reason, string? Source, string ContentSha256)
    {
        public static VersionEntry Of(GridVersion v) => new(v.GridName, v.Version, v.LoadedAt, v.LoadedBy.Name, v.LoadedBy.Role, v.Reason, v.Source, v.ContentSha256);
    }

    public sealed record FieldEntry(string Field, string? Before, string? After);

    public sealed record ElementEntry(string Kind, string Id, string Change, IReadOnlyList<FieldEntry> Fields);

    public sealed record DifferenceDocument(int? From, int? To, IReadOnlyList<FieldEntry> Grid, IReadOnlyList<ElementEntry> Elements)
    {
        public static DifferenceDocument Of(int? from, int? to, GridDifference d) => new(from, to,
            [.. d.GridFields.Select(f => new FieldEntry(f.Field, f.Before, f.After))],
            [.. d.Elements.Select(e => new ElementEntry(e.Kind, e.Id, e.Change.ToString().ToLowerInvariant(), [.. e.Fields.Select(f => new FieldEntry(f.Field, f.Before, f.After))]))]);
    }

    public sealed record LoadDocument(string Outcome, string? Grid, int? Version, int? Latest, string? Message, DifferenceDocument? Difference)
    {
        public static LoadDocument Of(GridLoad load) => new(
            load.Outcome switch
            {
                GridLoadOutcome.Stored => "stored",
                GridLoadOutcome.Unchanged => "unchanged",
                GridLoadOutcome.NeedsConfirmation => "needsConfirmation",
                _ => "refused",
            },
            load.GridName, load.Version?.Version, load.Latest?.Version, load.Refusal,
            load.Difference is { } d ? DifferenceDocument.Of(load.Latest?.Version, load.Version?.Version, d) : null);
    }

    public sealed record MoveEntry(int From, int To, string Reason, string By, DateTimeOffset At);

    public sealed record PinDocument(string Grid, int Version, int? Latest, bool Stored, IReadOnlyList<MoveEntry> Moves)
    {
        public static PinDocument Of(IncidentState state, GridCatalog grids) => new(
            state.GridName, state.GridVersion, grids.Find(state.GridName)?.Version, grids.For(state) is not null,
            [.. state.GridMoves.Select(m => new MoveEntry(m.FromVersion, m.ToVersion, m.Reason, m.Actor.Name, m.At))]);
    }
}
