namespace Meanfield.Solver;

/// <summary>How the symmetry reduced a k-mesh sum.</summary>
/// <param name="Operations">Order of the symmetry group found (operations with and without time reversal).</param>
/// <param name="Unitary">Operations without time reversal.</param>
/// <param name="MeshOperations">Distinct actions on this mesh's points (a shifted mesh keeps fewer).</param>
/// <param name="FullPoints">Points of the full mesh.</param>
/// <param name="WedgePoints">Points of the irreducible wedge actually diagonalised.</param>
/// <param name="Names">Operation names (Hermann-Mauguin style with axes, primed with time reversal).</param>
public sealed record MeshReduction(int Operations, int Unitary, int MeshOperations, int FullPoints, int WedgePoints,
                                   IReadOnlyList<string> Names)
{
    /// <summary>Full points per wedge point.</summary>
    public double Factor => FullPoints / (double)WedgePoints;

    /// <summary>One line for summaries.</summary>
    public override string ToString() => Operations <= 1
        ? $"none used: {FullPoints} k-points"
        : $"{Operations} operations ({Unitary} unitary, {Operations - Unitary} with time reversal), {MeshOperations} act on this mesh: " +
          $"{WedgePoints} of {FullPoints} k-points ({Factor:F1}x fewer)";
}
