using System.Runtime.CompilerServices;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// The substation measurements' log-likelihood for a fault, in O(k): a record whose device does not have
/// the fault beyond it predicts no phase current, a residual of |U0|·3|Y0B| and the bus |U0|, so all
/// of them together are one smooth function of |U0| per substation, tabulated and interpolated (each
/// table entry computed when first needed: most rankings visit a small range of |U0|). Only the k records
/// with the fault beyond their device are evaluated one by one.
/// </summary>
internal sealed class MeasurementSums
{
    private const int TableSteps = 2048;
    private readonly RankingComputation _computation;
    private readonly IReadOnlyList<MeasurementPoint> _records;
    private readonly double[] _otherNetworks;
    private readonly double[][] _table;
    private readonly double[] _stepV;
    private readonly List<MeasurementPoint>[] _same;
    private readonly RecordBound[] _bounds;
    private readonly double[][] _notBeyondBoundSum;
    private readonly double[][] _neutralVoltagesV;
    private readonly RankingOptions _options;

    public MeasurementSums(RankingComputation computation, IReadOnlyList<MeasurementPoint> records, FaultResponseModel model)
    {
        _computation = computation;
        _records = records;
        var substations = model.Grid.Substations;
        _otherNetworks = new double[substations.Length];
        _table = new double[substations.Length][];
        _stepV = new double[substations.Length];
        _same = new List<MeasurementPoint>[substations.Length];
        _options = computation.Options;
        _bounds = [.. records.Select(r => RecordBound.Of(computation, r.Measurement))];
        _notBeyondBoundSum = new double[substations.Length][];
        _neutralVoltagesV = new double[substations.Length][];
        for (var sub = 0; sub < substations.Length; sub++)
        {
            foreach (var r in records.Where(r => r.Point.Substation != sub))
            {
                _otherNetworks[sub] += computation.MeasurementLogLikelihood(r.Measurement, (0, 0, 0));
            }

            // |U0| of an earth fault stays below about 1.5·E even near resonance; above, values are computed directly.
            var maximumV = Units.PhaseVoltageV(substations[sub].NominalVoltageKv, 1.5 * model.VoltageFactor);
            _stepV[sub] = maximumV / TableSteps;
            _same[sub] = [.. records.Where(r => r.Point.Substation == sub)];
            _table[sub] = new double[TableSteps + 1];
            Array.Fill(_table[sub], double.NaN);
            _neutralVoltagesV[sub] = [.. _same[sub].Where(r => r.Measurement.NeutralVoltageV is not null).Select(r => r.Measurement.NeutralVoltageV!.Value)];
            _notBeyondBoundSum[sub] = new double[2];
            for (var m = 0; m < records.Count; m++)
            {
                if (records[m].Point.Substation == sub)
                {
                    _notBeyondBoundSum[sub][0] += _bounds[m].NotBeyondShortCircuit;
                    _notBeyondBoundSum[sub][1] += _bounds[m].NotBeyondEarthFault;
                }
            }
        }
    }

    /// <summary>
    /// An upper bound of <see cref="LogLikelihood"/> over every fault on the substation's network whose |U0|
    /// lies within [<paramref name="u0MinV"/>, <paramref name="u0MaxV"/>] (0 and 0: a short circuit, which
    /// drives no residual current), whatever its phase current, with the records <paramref name="beyond"/>
    /// having it beyond their device. Each term is a robust log density, at most −ln σ_min − ½ ln 2π where
    /// its prediction is free, and exact where the prediction is 0 whatever the fault (the phase current of
    /// a device without the fault beyond it; every residual current of a short circuit). The neutral
    /// voltage is bounded over the |U0| interval widened by one step of the table that interpolates it.
    /// </summary>
    public double UpperBound(int sub, double u0MinV, double u0MaxV, IReadOnlyList<int> beyond)
    {
        var shortCircuit = u0MaxV <= 0;
        var sum = _otherNetworks[sub] + _notBeyondBoundSum[sub][shortCircuit ? 0 : 1];
        foreach (var m in beyond)
        {
            var b = _bounds[m];
            sum += shortCircuit ? b.BeyondShortCircuit - b.NotBeyondShortCircuit : b.BeyondEarthFault - b.NotBeyondEarthFault;
        }

        foreach (var neutral in _neutralVoltagesV[sub])
        {
            sum += shortCircuit
                ? MeasurementLikelihood.Log(_options.NeutralVoltageTolerance, neutral, 0)
                : MeasurementLikelihood.UpperBound(_options.NeutralVoltageTolerance, neutral, Math.Max(0, u0MinV - _stepV[sub]), u0MaxV + _stepV[sub]);
        }

        return sum;
    }

    /// <summary>
    /// One record's bounds without its neutral voltage: its device without and with the fault beyond it, for a
    /// short circuit (no residual current anywhere) and for an earth fault (residual free).
    /// </summary>
    private readonly record struct RecordBound(double NotBeyondShortCircuit, double BeyondShortCircuit, double NotBeyondEarthFault, double BeyondEarthFault)
    {
        public static RecordBound Of(RankingComputation computation, SubstationMeasurement m)
        {
            var o = computation.Options;
            var phaseAtZero = m.PhaseCurrentA is { } p ? MeasurementLikelihood.Log(o.PhaseCurrentTolerance, p, 0) : 0;
            var phaseFree = m.PhaseCurrentA is null ? 0 : MeasurementLikelihood.Maximum(o.PhaseCurrentTolerance);
            var residualAtZero = m.ResidualCurrentA is { } r ? MeasurementLikelihood.Log(o.ResidualCurrentTolerance, r, 0) : 0;
            // With a phase current recorded, the residual may be taken as the same information and left out: a term of 0.
            var residualFree = m.ResidualCurrentA is null ? 0
                : m.PhaseCurrentA is null ? MeasurementLikelihood.Maximum(o.ResidualCurrentTolerance)
                : Math.Max(0, MeasurementLikelihood.Maximum(o.ResidualCurrentTolerance));
            return new RecordBound(
                phaseAtZero + residualAtZero,
                phaseFree + residualAtZero,
                phaseAtZero + residualFree,
                phaseFree + residualFree);
        }
    }

    /// <summary>Σ log-likelihood of every record for the fault; <paramref name="beyond"/> lists the records whose device has it beyond.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double LogLikelihood(in FaultSolution fault, IReadOnlyList<int> beyond)
    {
        var sub = fault.Substation;
        var u0 = fault.NeutralVoltageMagnitudeV;
        var sum = _otherNetworks[sub] + Interpolate(sub, u0);
        foreach (var m in beyond)
        {
            var record = _records[m];
            var p = record.Point;
            var asNotBeyond = _computation.MeasurementLogLikelihood(record.Measurement, (0, u0 * p.NotBeyondGainS, u0));
            var actual = _computation.MeasurementLogLikelihood(record.Measurement, (fault.FaultedPhaseCurrentA, u0 * p.BeyondGainS, u0));
            sum += actual - asNotBeyond;
        }

        return sum;
    }

    private double Interpolate(int sub, double u0)
    {
        var x = u0 / _stepV[sub];
        var k = (int)x;
        if (k >= TableSteps)
        {
            return NotBeyond(_same[sub], u0);
        }

        var t = x - k;
        return (Entry(sub, k) * (1 - t)) + (Entry(sub, k + 1) * t);
    }

    private double Entry(int sub, int k)
    {
        var table = _table[sub];
        if (double.IsNaN(table[k]))
        {
            table[k] = NotBeyond(_same[sub], k * _stepV[sub]);
        }

        return table[k];
    }

    private double NotBeyond(List<MeasurementPoint> same, double u0)
    {
        var sum = 0.0;
        foreach (var r in same)
        {
            sum += _computation.MeasurementLogLikelihood(r.Measurement, (0, u0 * r.Point.NotBeyondGainS, u0));
        }

        return sum;
    }
}
