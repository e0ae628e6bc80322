namespace FeederLocate.LoadTest;

/// <summary>Running totals shared by every client, for the progress line while the load runs.</summary>
public sealed class LoadCounters
{
    private long _requests;
    private long _errors;
    private long _acceptedIndications;

    public long Requests => Interlocked.Read(ref _requests);

    public long Errors => Interlocked.Read(ref _errors);

    public long AcceptedIndications => Interlocked.Read(ref _acceptedIndications);

    public void Request() => Interlocked.Increment(ref _requests);

    public void Error() => Interlocked.Increment(ref _errors);

    public void Accepted(int indications) => Interlocked.Add(ref _acceptedIndications, indications);
}
