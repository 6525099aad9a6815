using Meanfield.Lattices;

namespace Meanfield.Analysis;

/// <summary>
/// Every tolerance the spectrum analysis (node search, degeneracy, gaps, pinning, the phase rule) judges by, in one
/// place and relative to the scale it judges, never to the total bandwidth: in the Kondo regime the renormalized bands
/// next to the Fermi level are 1e-3 of the bandwidth or narrower, and a tolerance tied to the whole spectrum would be
/// larger than everything worth resolving there (common practice: compare like with like).
/// </summary>
/// <remarks>
/// The scales:
/// <list type="bullet">
/// <item><see cref="PairWidth"/>: the energy range spanned by the two bands next to the electron count (bands n_occ - 1
/// and n_occ, 0-based), max E_nocc - min E_nocc-1 over the zone. Energy tolerances are fractions of it.</item>
/// <item><see cref="ReciprocalLength"/>: the shortest reciprocal primitive vector |b|_min. Distances in k are fractions
/// of it, so they do not change with the lattice constant in reduced terms.</item>
/// <item><see cref="Temperature"/>: k_B T in the energy unit, which bounds how close to mu "at mu" can mean.</item>
/// <item><see cref="NumericalFloor"/>: the eigenvalue round-off of the largest matrix element, below which no energy
/// difference is meaningful (a few units of n eps ||H||).</item>
/// </list>
/// Multiplying every energy of a model by s and every length by l rescales these scales with it, so every decision
/// taken with them is unchanged (tested).
/// </remarks>
public sealed record SpectrumTolerances
{
    /// <summary>A refined node counts as a touching when its gap is below this fraction of <see cref="PairWidth"/>.</summary>
    public const double NodeGapFraction = 1e-10;
    /// <summary>Bands within this fraction of <see cref="PairWidth"/> of each other are degenerate (Kramers pairs, Dirac nodes).</summary>
    public const double DegeneracyFraction = 1e-7;
    /// <summary>An indirect gap above this fraction of <see cref="PairWidth"/> separates the spectrum.</summary>
    public const double GapFraction = 1e-6;
    /// <summary>A band overlap beyond the spread of the node energies by more than this fraction of the width is a Fermi surface.</summary>
    public const double OverlapFraction = 1e-6;
    /// <summary>A node is at mu within max(k_B T, this fraction of <see cref="PairWidth"/>).</summary>
    public const double PinningFraction = 1e-6;
    /// <summary>Two refined nodes closer than this fraction of |b|_min (modulo reciprocal vectors) are one node.</summary>
    public const double MergeFraction = 1e-6;
    /// <summary>Round-off multiplier: eigenvalues of an n x n matrix are good to about n eps ||H||; we allow 64 times that.</summary>
    public const double RoundOffMultiplier = 64;
    /// <summary>The spacing of doubles at 1 (2^-52).</summary>
    public const double MachineEpsilon = 2.220446049250313e-16;

    /// <summary>Energy range of bands n_occ - 1 and n_occ over the zone (energy unit), positive.</summary>
    public required double PairWidth { get; init; }
    /// <summary>|b|_min (inverse angstrom), positive.</summary>
    public required double ReciprocalLength { get; init; }
    /// <summary>k_B T (energy unit), zero or positive.</summary>
    public double Temperature { get; init; }
    /// <summary>Smallest meaningful energy difference (energy unit), positive.</summary>
    public required double NumericalFloor { get; init; }

    /// <summary>Target gap of node refinement: max(<see cref="NodeGapFraction"/> x width, the numerical floor).</summary>
    public double NodeGap => Math.Max(NodeGapFraction * PairWidth, NumericalFloor);
    /// <summary>Degeneracy window (energy unit).</summary>
    public double Degeneracy => Math.Max(DegeneracyFraction * PairWidth, 16 * NumericalFloor);
    /// <summary>Smallest indirect gap that separates the spectrum (energy unit).</summary>
    public double Gap => Math.Max(GapFraction * PairWidth, 16 * NumericalFloor);
    /// <summary>Band overlap tolerance (energy unit).</summary>
    public double Overlap => Math.Max(OverlapFraction * PairWidth, 16 * NumericalFloor);
    /// <summary>Largest |E_node - mu| that counts as pinned (energy unit).</summary>
    public double Pinning => Math.Max(Temperature, Math.Max(PinningFraction * PairWidth, 16 * NumericalFloor));
    /// <summary>Distance below which two nodes are one (inverse angstrom).</summary>
    public double Merge => MergeFraction * ReciprocalLength;

    /// <summary>
    /// Tolerances for a spectrum whose bands n_occ - 1 and n_occ span [<paramref name="pairLow"/>,
    /// <paramref name="pairHigh"/>] and whose eigenvalues reach <paramref name="largestEnergy"/> in magnitude, on a
    /// <paramref name="size"/>-band Hamiltonian over <paramref name="lattice"/> at temperature
    /// <paramref name="temperature"/> (energy unit).
    /// </summary>
    /// <exception cref="ArgumentException">A non-finite energy or a negative temperature.</exception>
    public static SpectrumTolerances For(double pairLow, double pairHigh, double largestEnergy, int size, Lattice lattice, double temperature)
    {
        if (!double.IsFinite(pairLow) || !double.IsFinite(pairHigh) || !double.IsFinite(largestEnergy))
            throw new ArgumentException("band energies must be finite");
        if (!(temperature >= 0) || double.IsInfinity(temperature)) throw new ArgumentException($"temperature must be >= 0, got {temperature}");
        double floor = RoundOffMultiplier * Math.Max(size, 1) * MachineEpsilon * Math.Max(Math.Abs(largestEnergy), double.Epsilon);
        double width = Math.Max(pairHigh - pairLow, floor);
        return new SpectrumTolerances
        {
            PairWidth = Math.Max(width, double.Epsilon), ReciprocalLength = ShortestReciprocal(lattice),
            Temperature = temperature, NumericalFloor = Math.Max(floor, double.Epsilon),
        };
    }

    /// <summary>|b|_min over the lattice's periodic directions (inverse angstrom).</summary>
    public static double ShortestReciprocal(Lattice lattice) =>
        Math.Min(lattice.B1.Norm, Math.Min(lattice.B2.Norm, lattice.Dimension == 3 ? lattice.B3.Norm : double.PositiveInfinity));
}
