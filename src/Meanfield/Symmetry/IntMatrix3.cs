namespace Meanfield.Symmetry;

/// <summary>An integer 3 x 3 matrix, row-major (a point operation in lattice or reciprocal-lattice coordinates).</summary>
public readonly record struct IntMatrix3(int M00, int M01, int M02, int M10, int M11, int M12, int M20, int M21, int M22)
{
    public static readonly IntMatrix3 Identity = new(1, 0, 0, 0, 1, 0, 0, 0, 1);

    /// <summary>Element (row, column), both 0..2.</summary>
    public int this[int r, int c] => (r * 3 + c) switch
    {
        0 => M00, 1 => M01, 2 => M02, 3 => M10, 4 => M11, 5 => M12, 6 => M20, 7 => M21, 8 => M22,
        _ => throw new IndexOutOfRangeException(),
    };

    public static IntMatrix3 FromArray(ReadOnlySpan<int> m) => new(m[0], m[1], m[2], m[3], m[4], m[5], m[6], m[7], m[8]);

    public int Determinant => M00 * (M11 * M22 - M12 * M21) - M01 * (M10 * M22 - M12 * M20) + M02 * (M10 * M21 - M11 * M20);

    public static IntMatrix3 operator *(IntMatrix3 a, IntMatrix3 b)
    {
        Span<int> m = stackalloc int[9];
        for (int r = 0; r < 3; r++)
            for (int c = 0; c < 3; c++)
                m[r * 3 + c] = a[r, 0] * b[0, c] + a[r, 1] * b[1, c] + a[r, 2] * b[2, c];
        return FromArray(m);
    }

    public static IntMatrix3 operator -(IntMatrix3 a) => new(-a.M00, -a.M01, -a.M02, -a.M10, -a.M11, -a.M12, -a.M20, -a.M21, -a.M22);

    public override string ToString() => $"[[{M00},{M01},{M02}],[{M10},{M11},{M12}],[{M20},{M21},{M22}]]";
}
