using Meanfield.Analysis.Dos;

namespace Meanfield.Analysis;

/// <summary>
/// Zero-temperature chemical potential of a spectrum on a k-mesh: fill the N_k x N_e lowest states and put mu halfway
/// between the last filled and the first empty one (mid-gap for an insulator; the Fermi level of a metal up to the
/// mesh resolution). Common practice for bare (unsolved) models, which carry no chemical potential of their own.
/// </summary>
public static class MeshFermiLevel
{
    /// <summary>mu (energy unit) for <paramref name="electronsPerCell"/> electrons per cell, all flavours counted.</summary>
    public static double Find(MeshSpectrum spectrum, double electronsPerCell)
    {
        var all = (double[])spectrum.Energies.Clone();
        Array.Sort(all);
        double filled = electronsPerCell * spectrum.Mesh.Count;
        int n = (int)Math.Round(filled);
        if (Math.Abs(filled - n) > 1e-6) n = (int)Math.Floor(filled) + 1; // the partly filled state sets mu
        if (n <= 0) return all[0];
        if (n >= all.Length) return all[^1];
        return 0.5 * (all[n - 1] + all[n]);
    }
}
