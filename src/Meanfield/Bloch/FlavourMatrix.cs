using System.Numerics;

namespace Meanfield.Bloch;

/// <summary>
/// An F x F complex matrix acting on the flavour (spin) index of one orbital pair, row-major.
/// For F = 2 it is a combination a0 1 + ax sigma_x + ay sigma_y + az sigma_z of the identity and the Pauli matrices.
/// </summary>
public sealed class FlavourMatrix
{
    private readonly Complex[] _m;
    public int Flavours { get; }
    public FlavourMatrix(int flavours, Complex[] elements)
    {
        if (elements.Length != flavours * flavours) throw new ArgumentException("need F*F elements");
        Flavours = flavours; _m = (Complex[])elements.Clone();
    }

    public Complex this[int a, int b] => _m[a * Flavours + b];
    public ReadOnlySpan<Complex> Elements => _m;

    public static FlavourMatrix Identity(int flavours, Complex scale)
    {
        var m = new Complex[flavours * flavours];
        for (int a = 0; a < flavours; a++) m[a * flavours + a] = scale;
        return new(flavours, m);
    }

    /// <summary>a0 1 + ax sigma_x + ay sigma_y + az sigma_z (spin-1/2 only).</summary>
    public static FlavourMatrix Pauli(Complex a0, Complex ax, Complex ay, Complex az) =>
        new(2, [a0 + az, ax - Complex.ImaginaryOne * ay, ax + Complex.ImaginaryOne * ay, a0 - az]);

    public FlavourMatrix Scale(Complex s)
    {
        var m = new Complex[_m.Length];
        for (int i = 0; i < m.Length; i++) m[i] = s * _m[i];
        return new(Flavours, m);
    }

    public FlavourMatrix Add(FlavourMatrix other)
    {
        var m = new Complex[_m.Length];
        for (int i = 0; i < m.Length; i++) m[i] = _m[i] + other._m[i];
        return new(Flavours, m);
    }

    public bool IsHermitian(double tolerance)
    {
        for (int a = 0; a < Flavours; a++)
            for (int b = 0; b < Flavours; b++)
                if (Complex.Abs(this[a, b] - Complex.Conjugate(this[b, a])) > tolerance) return false;
        return true;
    }

    public double MaxAbs()
    {
        double m = 0;
        foreach (var z in _m) m = Math.Max(m, Complex.Abs(z));
        return m;
    }
}
