namespace FeederLocate.Core.Ranking;

/// <summary>Sums of probabilities held as logarithms, without underflow.</summary>
internal static class LogMath
{
    /// <summary>log(e^a + e^b).</summary>
    public static double Add(double a, double b)
    {
        if (double.IsNegativeInfinity(a))
        {
            return b;
        }

        if (double.IsNegativeInfinity(b))
        {
            return a;
        }

        return a > b ? a + double.LogP1(Math.Exp(b - a)) : b + double.LogP1(Math.Exp(a - b));
    }

    /// <summary>Normalises log weights into probabilities that sum to 1.</summary>
    public static double[] Normalise(IReadOnlyList<double> logWeights)
    {
        var max = double.NegativeInfinity;
        foreach (var w in logWeights)
        {
            max = Math.Max(max, w);
        }

        var p = new double[logWeights.Count];
        if (double.IsNegativeInfinity(max))
        {
            Array.Fill(p, 1.0 / Math.Max(1, p.Length));
            return p;
        }

        var sum = 0.0;
        for (var i = 0; i < p.Length; i++)
        {
            p[i] = Math.Exp(logWeights[i] - max);
            sum += p[i];
        }

        for (var i = 0; i < p.Length; i++)
        {
            p[i] /= sum;
        }

        return p;
    }
}
