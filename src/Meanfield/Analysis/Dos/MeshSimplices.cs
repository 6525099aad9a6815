using Meanfield.Lattices;

namespace Meanfield.Analysis.Dos;

/// <summary>
/// The simplices that tile the zone on a Monkhorst-Pack mesh: in 3D each parallelepiped of the mesh is cut into six
/// tetrahedra sharing its shortest main diagonal (Bloechl, Jepsen &amp; Andersen, PRB 49, 16223 (1994), Sec. II);
/// in 2D each parallelogram into two triangles along its shorter diagonal. Corners are mesh-point indices (periodic).
/// Every simplex carries the weight 1 / (Count) of the zone volume. A shifted mesh is the Gamma-centred one translated
/// by half a step: its cells tile the same periodic zone (eigenvalues are periodic in the reciprocal lattice), so both
/// kinds are accepted.
/// </summary>
public sealed class MeshSimplices
{
    /// <summary>3 (tetrahedra) or 2 (triangles).</summary>
    public int Dimension { get; }
    public int CornersPerSimplex => Dimension + 1;
    /// <summary>Corners[s * CornersPerSimplex + c] = mesh index of corner c of simplex s.</summary>
    public int[] Corners { get; }
    public int Count { get; }

    private MeshSimplices(int dimension, int[] corners)
    {
        Dimension = dimension; Corners = corners; Count = corners.Length / (dimension + 1);
    }

    /// <summary>The simplices of every mesh cell.</summary>
    /// <exception cref="ArgumentException">The lattice is neither 2D nor 3D.</exception>
    public static MeshSimplices Build(KMesh mesh)
    {
        return mesh.Lattice.Dimension switch
        {
            3 => Tetrahedra(mesh),
            2 => Triangles(mesh),
            _ => throw new ArgumentException("Tetrahedra need a lattice with momentum (2D or 3D)."),
        };
    }

    /// <summary>
    /// The simplices of one mesh cell as local corner codes: code c is the cell corner (i1 + (c &amp; 1), i2 + (c &gt;&gt; 1
    /// &amp; 1), i3 + (c &gt;&gt; 2 &amp; 1)). 3D: 6 tetrahedra x 4 codes; 2D: 2 triangles x 3 codes. The same cut as
    /// <see cref="Build"/>, for loops that walk the cells without storing the corner table.
    /// </summary>
    /// <exception cref="ArgumentException">The lattice is neither 2D nor 3D.</exception>
    public static int[] CellPattern(KMesh mesh)
    {
        if (mesh.Lattice.Dimension == 2)
            return (Step(mesh, 3) - Step(mesh, 0)).Norm <= (Step(mesh, 2) - Step(mesh, 1)).Norm ? [0, 1, 3, 0, 2, 3] : [1, 0, 2, 1, 3, 2];
        if (mesh.Lattice.Dimension != 3) throw new ArgumentException("Tetrahedra need a lattice with momentum (2D or 3D).");
        int start = DiagonalStart(mesh);
        var codes = new int[24];
        int p = 0;
        foreach (var perm in Permutations)
        {
            int c = start;
            codes[p++] = c;
            for (int s = 0; s < 3; s++) { c ^= perm[s]; codes[p++] = c; }
        }
        return codes;
    }

    private static readonly int[][] Permutations = [[1, 2, 4], [1, 4, 2], [2, 1, 4], [2, 4, 1], [4, 1, 2], [4, 2, 1]];

    private static int DiagonalStart(KMesh mesh)
    {
        // Corner c of a cell has offsets (c & 1, c >> 1 & 1, c >> 2 & 1); the diagonal from c0 to c0 ^ 7.
        int start = 0; double best = double.PositiveInfinity;
        for (int c0 = 0; c0 < 4; c0++)
        {
            double len = (Step(mesh, c0 ^ 7) - Step(mesh, c0)).Norm;
            if (len < best - 1e-12 * best) { best = len; start = c0; }
        }
        return start;
    }

    private static Vec3 Step(KMesh m, int bits) =>
        m.Lattice.Cartesian((bits & 1) / (double)m.N1, ((bits >> 1) & 1) / (double)m.N2, ((bits >> 2) & 1) / (double)m.N3);

    private static MeshSimplices Tetrahedra(KMesh mesh)
    {
        var codes = CellPattern(mesh);
        var corners = new int[mesh.Count * 6 * 4];
        int p = 0;
        for (int i1 = 0; i1 < mesh.N1; i1++)
            for (int i2 = 0; i2 < mesh.N2; i2++)
                for (int i3 = 0; i3 < mesh.N3; i3++)
                    foreach (var c in codes) corners[p++] = Corner(mesh, i1, i2, i3, c);
        return new MeshSimplices(3, corners);
    }

    private static MeshSimplices Triangles(KMesh mesh)
    {
        bool mainDiagonal = (Step(mesh, 3) - Step(mesh, 0)).Norm <= (Step(mesh, 2) - Step(mesh, 1)).Norm;
        var corners = new int[mesh.Count * 2 * 3];
        int p = 0;
        for (int i1 = 0; i1 < mesh.N1; i1++)
            for (int i2 = 0; i2 < mesh.N2; i2++)
            {
                int c00 = Corner(mesh, i1, i2, 0, 0), c10 = Corner(mesh, i1, i2, 0, 1);
                int c01 = Corner(mesh, i1, i2, 0, 2), c11 = Corner(mesh, i1, i2, 0, 3);
                if (mainDiagonal)
                {
                    corners[p++] = c00; corners[p++] = c10; corners[p++] = c11;
                    corners[p++] = c00; corners[p++] = c01; corners[p++] = c11;
                }
                else
                {
                    corners[p++] = c10; corners[p++] = c00; corners[p++] = c01;
                    corners[p++] = c10; corners[p++] = c11; corners[p++] = c01;
                }
            }
        return new MeshSimplices(2, corners);
    }

    private static int Corner(KMesh m, int i1, int i2, int i3, int bits) =>
        m.Index(i1 + (bits & 1), i2 + ((bits >> 1) & 1), i3 + ((bits >> 2) & 1));
}
