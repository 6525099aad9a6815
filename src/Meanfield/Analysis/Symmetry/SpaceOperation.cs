using System.Numerics;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Symmetry;

/// <summary>
/// A space-group operation {g|t} (x -> g x + t) that leaves a model's Bloch Hamiltonian invariant, with its action on
/// the basis. With the Bloch phase of <see cref="Bloch.BlochHamiltonian"/> (site positions included) the action is k-independent up to a
/// global phase: H(g k)[P(o) a, P(o') b] = chi_o chi_o' (S H(k) S^dag)[o a, o' b], where P is the orbital image,
/// chi_o = +-1 the orbital's character and S the flavour (spin) matrix of the proper part det(g) g.
/// </summary>
/// <param name="Rotation">g as a row-major 3x3 Cartesian orthogonal matrix.</param>
/// <param name="Translation">t in angstrom.</param>
/// <param name="OrbitalImage">P(o): the orbital index each orbital is carried to.</param>
/// <param name="Character">chi_o = +1 or -1 per orbital (the orbital's parity when g is the inversion).</param>
/// <param name="Spin">F x F flavour matrix S (row-major), the SU(2) image of det(g) g for spin-1/2, else the identity.</param>
public sealed record SpaceOperation(double[] Rotation, Vec3 Translation, int[] OrbitalImage, int[] Character, Complex[] Spin)
{
    /// <summary>det g: +1 for a proper rotation, -1 for an improper one (mirror, inversion, rotoinversion).</summary>
    public double Determinant =>
        Rotation[0] * (Rotation[4] * Rotation[8] - Rotation[5] * Rotation[7])
        - Rotation[1] * (Rotation[3] * Rotation[8] - Rotation[5] * Rotation[6])
        + Rotation[2] * (Rotation[3] * Rotation[7] - Rotation[4] * Rotation[6]);

    /// <summary>True when g = -1 (the inversion about the centre t / 2).</summary>
    public bool IsInversion
    {
        get
        {
            for (int i = 0; i < 3; i++)
                for (int j = 0; j < 3; j++)
                    if (Math.Abs(Rotation[i * 3 + j] - (i == j ? -1 : 0)) > 1e-9) return false;
            return true;
        }
    }

    /// <summary>g v.</summary>
    public Vec3 Apply(Vec3 v) => new(
        Rotation[0] * v.X + Rotation[1] * v.Y + Rotation[2] * v.Z,
        Rotation[3] * v.X + Rotation[4] * v.Y + Rotation[5] * v.Z,
        Rotation[6] * v.X + Rotation[7] * v.Y + Rotation[8] * v.Z);

    /// <summary>The inversion centre t / 2 (meaningful when <see cref="IsInversion"/>).</summary>
    public Vec3 Centre => Translation / 2;
}
