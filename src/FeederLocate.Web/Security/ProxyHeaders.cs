using System.Net;
using Microsoft.AspNetCore.HttpOverrides;

namespace FeederLocate.Web.Security;

/// <summary>
/// X-Forwarded-For and X-Forwarded-Proto are believed only from the proxy addresses configured in
/// <c>FeederLocate:TrustedProxies</c> (none by default, not even loopback): behind a TLS proxy the request is
/// then seen as HTTPS (the session cookie gets <c>Secure</c>) and from the real client (the sign-in throttle
/// and the machine's own sign-in see who it is). From anyone else the headers are ignored.
/// </summary>
public static class ProxyHeaders
{
    public static ForwardedHeadersOptions Options(IEnumerable<string> trustedProxies)
    {
        var options = new ForwardedHeadersOptions
        {
            ForwardedHeaders = ForwardedHeaders.XForwardedFor | ForwardedHeaders.XForwardedProto,
            ForwardLimit = 1,
        };
        options.KnownIPNetworks.Clear();
        options.KnownProxies.Clear();
        foreach (var text in trustedProxies)
        {
            options.KnownProxies.Add(IPAddress.TryParse(text, out var address)
                ? address
                : throw new InvalidOperationException($"FeederLocate:TrustedProxies: \"{text}\" is not an IP address"));
        }

        return options;
    }
}
