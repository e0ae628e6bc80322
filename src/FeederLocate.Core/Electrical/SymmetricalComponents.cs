using MathNet.Numerics.LinearAlgebra;
using Complex = System.Numerics.Complex;

namespace FeederLocate.Core.Electrical;

/// <summary>Fortescue transform between sequence (0, 1, 2) and phase (a, b, c) quantities.</summary>
public static class SymmetricalComponents
{
    /// <summary>The operator a = e^(j120°).</summary>
    public static readonly Complex A = Complex.FromPolarCoordinates(1, 2 * Math.PI / 3);

    /// <summary>[a b c]ᵀ = T·[0 1 2]ᵀ with T = [[1 1 1] [1 a² a] [1 a a²]].</summary>
    public static readonly Matrix<Complex> SequenceToPhase = Matrix<Complex>.Build.DenseOfArray(new[,]
    {
        { Complex.One, Complex.One, Complex.One },
        { Complex.One, A * A, A },
        { Complex.One, A, A * A },
    });

    private static readonly Complex ASquared = A * A;

    /// <summary>Phase quantities (a, b, c) from sequence quantities (0, 1, 2), through the matrix <see cref="SequenceToPhase"/>.</summary>
    public static (Complex A, Complex B, Complex C) ToPhases(Complex zero, Complex positive, Complex negative)
    {
        var phases = SequenceToPhase * Vector<Complex>.Build.DenseOfArray([zero, positive, negative]);
        return (phases[0], phases[1], phases[2]);
    }

    /// <summary>The same transform written out, without allocating: for the inner loops of the ranking.</summary>
    public static (Complex A, Complex B, Complex C) ToPhasesScalar(Complex zero, Complex positive, Complex negative) =>
        (zero + positive + negative, zero + (ASquared * positive) + (A * negative), zero + (A * positive) + (ASquared * negative));
}
