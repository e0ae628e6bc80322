using System.Runtime.CompilerServices;
using FeederLocate.Core.Electrical;
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

    public MeasurementSums(RankingComputation computation, IReadOnlyList<MeasurementPoint> records, FaultResponseModel model)
    {
        _computation = computation;
        _records = records;
        var substations = model.Grid.Substations;
        _otherNetworks = new double[substations.Length];
        _table = new double[substations.Length][];
        _stepV = new double[substations.Length];
        _same = new List<MeasurementPoint>[substations.Length];
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
