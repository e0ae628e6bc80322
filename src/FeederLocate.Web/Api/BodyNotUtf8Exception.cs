namespace FeederLocate.Web.Api;

/// <summary>A request body that is not valid UTF-8: refused, never repaired by replacing the bad bytes.</summary>
public sealed class BodyNotUtf8Exception() : Exception("the body is not valid UTF-8 (RFC 8259 requires it of JSON); nothing was saved");
