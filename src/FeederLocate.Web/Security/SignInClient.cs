using System.Net;

namespace FeederLocate.Web.Security;

/// <summary>
/// Where a sign-in comes from: the client's address (after a trusted proxy's X-Forwarded-For) and whether it
/// is the machine the app runs on. A locked account still signs in from the machine itself, so a guesser
/// elsewhere cannot lock the last engineer out.
/// </summary>
public sealed record SignInClient(string Address, bool IsThisMachine)
{
    /// <summary>A caller that does not say (tests, tools): never the machine itself.</summary>
    public static readonly SignInClient Unknown = new("unknown", false);

    public static SignInClient Of(HttpContext http)
    {
        ArgumentNullException.ThrowIfNull(http);
        var remote = http.Connection.RemoteIpAddress;
        if (remote is null)
        {
            return Unknown;
        }

        if (remote.IsIPv4MappedToIPv6)
        {
            remote = remote.MapToIPv4();
        }

        return new SignInClient(remote.ToString(), IPAddress.IsLoopback(remote));
    }
}
