using System.Runtime.CompilerServices;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// The indications' log-likelihood for a fault on a segment, in O(log n + k + b) instead of O(n):
/// an indicator looking away from the source with the fault not beyond it sees no phase current and a
/// residual of |U0|·3|Y0B|, so its term is a step in |U0| — summed for all of them at once by a binary
/// search over sorted thresholds — except for the b indicators whose pickup lies within the
/// <see cref="PickupCurve"/>'s uncertain band around that residual, evaluated one by one. So are the k
/// indicators with the fault beyond them (those on the path from the source, found by walking a chain up
/// the tree) and the few looking toward the source.
/// </summary>
internal sealed class IndicationSums
{
    private readonly IReadOnlyList<ObservedIndication> _observed;
    private readonly FaultResponseModel _model;
    private readonly double[] _otherNetworks;
    private readonly double[][] _thresholdsV;
    private readonly double[][] _prefix;
    private readonly int[][] _sortedIndicator;
    private readonly BandTerm[][] _bandTerms;
    private readonly double _sigma;
    private readonly double _band;
    private readonly double[] _base;
    private readonly int[][] _towardSource;
    private readonly int[] _chainHead;
    private readonly List<(int Indicator, int Next)> _chain = [];
    private readonly Dictionary<int, List<int>> _onSegment = [];
    private readonly double[][] _positivePrefix;
    private readonly double[] _towardMaximum;

    public IndicationSums(FaultResponseModel model, IReadOnlyList<ObservedIndication> observed, double pickupTolerance)
    {
        _model = model;
        _observed = observed;
        _sigma = pickupTolerance;
        _band = PickupCurve.BandFactor(pickupTolerance);
        var network = model.Network;
        var substations = model.Grid.Substations.Length;
        _otherNetworks = new double[substations];
        _thresholdsV = new double[substations][];
        _prefix = new double[substations][];
        _base = new double[substations];
        _towardSource = new int[substations][];
        _sortedIndicator = new int[substations][];
        _bandTerms = new BandTerm[substations][];
        _positivePrefix = new double[substations][];
        _towardMaximum = new double[substations];
        for (var sub = 0; sub < substations; sub++)
        {
            var steps = new List<(double Threshold, double Delta, int Indicator)>();
            var toward = new List<int>();
            for (var i = 0; i < observed.Count; i++)
            {
                var o = observed[i];
                var p = o.Point;
                if (p.Substation != sub)
                {
                    _otherNetworks[sub] += o.LogProbability(IndicatorState.None);
                }
                else if (!p.AwayFromSource)
                {
                    toward.Add(i);
                    _towardMaximum[sub] += Math.Max(o.LogProbability(IndicatorState.None), Math.Max(o.LogProbability(p.PickedUpState(true)), o.LogProbability(p.PickedUpState(false))));
                }
                else
                {
                    _base[sub] += o.LogProbability(IndicatorState.None);
                    var threshold = p.NotBeyondGainS > 0 ? p.EarthPickupA / p.NotBeyondGainS : double.NaN;
                    if (!double.IsNaN(threshold))
                    {
                        var picked = p.PickedUpState(faultBeyond: false);
                        steps.Add((threshold, o.LogProbability(picked) - o.LogProbability(IndicatorState.None), i));
                    }
                }
            }

            steps.Sort((a, b) => a.Threshold.CompareTo(b.Threshold));
            _thresholdsV[sub] = [.. steps.Select(s => s.Threshold)];
            _sortedIndicator[sub] = [.. steps.Select(s => s.Indicator)];
            _prefix[sub] = new double[steps.Count + 1];
            _positivePrefix[sub] = new double[steps.Count + 1];
            for (var k = 0; k < steps.Count; k++)
            {
                _prefix[sub][k + 1] = _prefix[sub][k] + steps[k].Delta;
                _positivePrefix[sub][k + 1] = _positivePrefix[sub][k] + Math.Max(0, steps[k].Delta);
            }

            _towardSource[sub] = [.. toward];
            _bandTerms[sub] = new BandTerm[steps.Count];
            for (var k = 0; k < steps.Count; k++)
            {
                var o = observed[steps[k].Indicator];
                var picked = o.ProbabilityByExpected[(int)o.Point.PickedUpState(faultBeyond: false)];
                var none = o.ProbabilityByExpected[(int)IndicatorState.None];
                var stepToHere = k == 0 ? 1 : PickupCurve.ExponentialFactor(steps[k].Threshold / steps[k - 1].Threshold, pickupTolerance);
                _bandTerms[sub][k] = new BandTerm((picked / none) - 1, o.Weight, stepToHere);
            }
        }

        // Chain of away-looking indicators above each node: pushed at the far end of their segment.
        _chainHead = new int[model.Grid.Nodes.Length];
        var atFarEnd = new Dictionary<int, List<int>>();
        for (var i = 0; i < observed.Count; i++)
        {
            var p = observed[i].Point;
            if (p.Substation >= 0 && p.AwayFromSource)
            {
                (atFarEnd.TryGetValue(p.FarNode, out var list) ? list : atFarEnd[p.FarNode] = []).Add(i);
                (_onSegment.TryGetValue(p.SelfSegment, out var own) ? own : _onSegment[p.SelfSegment] = []).Add(i);
            }
        }

        UpstreamChain.Link(network, atFarEnd, _chain, _chainHead);
    }

    /// <summary>Σ log P(record | expected) over every observed indication, for a fault on the segment.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double LogLikelihood(int segment, in FaultSolution fault)
    {
        var sub = fault.Substation;
        var u0 = fault.NeutralVoltageMagnitudeV;
        var thresholds = _thresholdsV[sub];
        // Thresholds at or below u0 / band: certain pickups, summed; from there up to u0 · band: uncertain, one by one.
        var certain = UpperBound(thresholds, u0 / _band);
        var sum = _otherNetworks[sub] + _base[sub] + _prefix[sub][certain];
        if (certain < thresholds.Length && thresholds[certain] < u0 * _band)
        {
            sum += Band(sub, certain, u0);
        }

        // Indicators with the fault beyond them: on the path from the source, and on the segment itself.
        for (var link = _chainHead[fault.SuppliedNode]; link >= 0; link = _chain[link].Next)
        {
            sum += Correction(_chain[link].Indicator, fault);
        }

        if (_onSegment.TryGetValue(segment, out var own))
        {
            foreach (var i in own)
            {
                sum += Correction(i, fault);
            }
        }

        foreach (var i in _towardSource[sub])
        {
            var p = _observed[i].Point;
            var beyond = _model.IsFaultBeyond(p, segment);
            var onPath = p.OnPath(beyond);
            var residual = u0 * (beyond ? p.BeyondGainS : p.NotBeyondGainS);
            sum += _observed[i].LogProbability(beyond, onPath, onPath ? fault.FaultedPhaseCurrentA : 0, residual, _sigma);
        }

        return sum;
    }

    /// <summary>
    /// An upper bound of <see cref="LogLikelihood"/> over every fault on the segment whose |U0| lies within
    /// [<paramref name="u0MinV"/>, <paramref name="u0MaxV"/>] (0 and 0 for short circuits), whatever its
    /// phase current: each indicator's term is a weighted log of a mixture of its picked-up and its none
    /// probabilities, so it is at most the larger of the two; where the residual it would see cannot reach
    /// its pickup band (or surely passes it) its term is the one state. Looking away from the source and
    /// without the fault beyond them: certain pickups summed, uncertain ones at their better state, in
    /// O(log n) over the sorted thresholds. With the fault beyond them (the chain from the source and the
    /// segment's own): the better of none and picked up, less the least their not-beyond term could be.
    /// Looking toward the source: their best state.
    /// </summary>
    public double UpperBound(int segment, int substation, int suppliedNode, double u0MinV, double u0MaxV)
    {
        var thresholds = _thresholdsV[substation];
        var certain = u0MinV > 0 ? UpperBound(thresholds, u0MinV / _band) : 0;
        var reachable = u0MaxV > 0 ? UpperBound(thresholds, u0MaxV * _band) : 0;
        var sum = _otherNetworks[substation] + _base[substation] + _prefix[substation][certain]
            + (_positivePrefix[substation][Math.Max(certain, reachable)] - _positivePrefix[substation][certain])
            + _towardMaximum[substation];
        for (var link = _chainHead[suppliedNode]; link >= 0; link = _chain[link].Next)
        {
            sum += CorrectionBound(_chain[link].Indicator, u0MaxV);
        }

        if (_onSegment.TryGetValue(segment, out var own))
        {
            foreach (var i in own)
            {
                sum += CorrectionBound(i, u0MaxV);
            }
        }

        return sum;
    }

    /// <summary>At most what <see cref="Correction"/> adds for an indicator with the fault beyond it, for |U0| up to <paramref name="u0MaxV"/>.</summary>
    private double CorrectionBound(int i, double u0MaxV)
    {
        var o = _observed[i];
        var p = o.Point;
        var none = o.LogProbability(IndicatorState.None);
        var beyond = Math.Max(none, o.LogProbability(p.PickedUpState(faultBeyond: true)));
        var threshold = p.NotBeyondGainS > 0 ? p.EarthPickupA / p.NotBeyondGainS : double.NaN;
        var notBeyondLeast = double.IsNaN(threshold) || threshold >= u0MaxV * _band
            ? none
            : Math.Min(none, o.LogProbability(p.PickedUpState(faultBeyond: false)));
        return beyond - notBeyondLeast;
    }

    /// <summary>
    /// Σ over the indicators whose threshold lies in the uncertain band around <paramref name="u0"/>, from
    /// sorted index <paramref name="first"/> on, of their term minus the none term already counted: the
    /// plain <see cref="NotBeyond"/> terms, rearranged so that the band costs one exponential and one
    /// logarithm rather than three transcendental functions per indicator. The pickup curve's exponential
    /// e^(−1.702 z) for each next threshold is the previous one times the precomputed ratio
    /// <see cref="PickupCurve.ExponentialFactor"/> of the two; each term is w·ln(1 + P(pickup)·(P(record |
    /// picked) / P(record | none) − 1)), and the terms of full weight are multiplied before one logarithm.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private double Band(int sub, int first, double u0)
    {
        var thresholds = _thresholdsV[sub];
        var terms = _bandTerms[sub];
        var limit = u0 * _band;
        var exponential = PickupCurve.ExponentialFactor(thresholds[first] / u0, _sigma);
        var product = 1.0;
        var sum = 0.0;
        var factors = 0;
        for (var k = first; k < thresholds.Length && thresholds[k] < limit; k++)
        {
            var term = terms[k];
            if (k > first)
            {
                exponential *= term.ExponentialStep;
            }

            var x = 1 + (PickupCurve.FromExponential(exponential) * term.RatioLessOne);
            if (term.Weight == 1)
            {
                product *= x;
                if (++factors == ProductLength)
                {
                    sum += Math.Log(product);
                    (product, factors) = (1.0, 0);
                }
            }
            else
            {
                sum += term.Weight * Math.Log(x);
            }
        }

        return sum + Math.Log(product);
    }

    /// <summary>Factors multiplied before a logarithm: each lies within about 1/100 to 100, so 64 of them stay far inside the range of a double.</summary>
    private const int ProductLength = 64;

    /// <summary>One indicator of the band: P(record | picked) / P(record | none) − 1, its weight, and e^(−1.702 Δz) from the previous threshold to its own.</summary>
    private readonly record struct BandTerm(double RatioLessOne, double Weight, double ExponentialStep);

    /// <summary>Replaces the not-beyond term counted in the sums by the beyond term.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private double Correction(int i, in FaultSolution fault)
    {
        var o = _observed[i];
        var u0 = fault.NeutralVoltageMagnitudeV;
        return o.LogProbability(true, true, fault.FaultedPhaseCurrentA, u0 * o.Point.BeyondGainS, _sigma) - NotBeyond(i, u0);
    }

    /// <summary>The term of an away-looking indicator without the fault beyond it: its residual alone.</summary>
    private double NotBeyond(int i, double u0)
    {
        var o = _observed[i];
        var p = o.Point;
        return p.NotBeyondGainS > 0 ? o.LogProbability(false, false, 0, u0 * p.NotBeyondGainS, _sigma) : o.LogProbability(IndicatorState.None);
    }

    /// <summary>How many thresholds are ≤ value.</summary>
    private static int UpperBound(double[] sorted, double value)
    {
        int lo = 0, hi = sorted.Length;
        while (lo < hi)
        {
            var mid = (lo + hi) >>> 1;
            if (sorted[mid] <= value)
            {
                lo = mid + 1;
            }
            else
            {
                hi = mid;
            }
        }

        return lo;
    }
}
