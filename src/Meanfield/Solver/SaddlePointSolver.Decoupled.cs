using Meanfield.Binding;
using Meanfield.Renormalization;

namespace Meanfield.Solver;

/// <summary>The decoupled (r = 0, local-moment) branch of the saddle point and its stability.</summary>
public sealed partial class SaddlePointSolver
{
    /// <summary>
    /// Stability of the decoupled solution: for every group, dF/d(r_g^2) per shell at r -&gt; 0 with lambda at its
    /// decoupled value (energy unit). Negative means F falls as r grows: the coherent Kondo solution takes over. At mean
    /// field the transition is continuous, so T_K^MF is where the smallest value crosses zero. To second order in the
    /// hybridization each group's r enters alone (one f orbital per process), so the groups decouple here.
    /// Null when no decoupled solution exists at this electron count.
    /// </summary>
    /// <exception cref="RequestError">A finite-U model: the mean-field Kondo temperature is an infinite-U notion here.</exception>
    public double[]? DecoupledStability(double probe = 1e-6)
    {
        if (_u is not null)
            throw new RequestError("the mean-field Kondo temperature (where r -> 0) is defined for the infinite-U boson; this model has finite U, whose four bosons do not vanish at a temperature: omit U to compute it");
        var decoupled = Decoupled();
        if (decoupled is null) return null;
        var x = new double[2 * G];
        for (int g = 0; g < G; g++) { x[g] = probe; x[G + g] = decoupled.Amplitudes.Lambda[g]; }
        var (res, _) = Evaluate(x);
        var c = new double[G];
        // res[G+g] = dF/dr per shell = 2 r dF/d(r^2)
        for (int g = 0; g < G; g++) c[g] = res[G + g] / (2 * probe);
        return c;
    }

    /// <summary>
    /// The r = 0 solution: f shells hold Q electrons each at a level pinned near mu, decoupled from the conduction band,
    /// which takes the remaining N_e - sum Q electrons. Per shell F_f = eps_f Q - T S_mf with the mean-field entropy
    /// S_mf = N ln N - Q ln Q - (N - Q) ln(N - Q). Null when the conduction band cannot hold the remaining electrons.
    /// </summary>
    public SaddlePoint? Decoupled()
    {
        if (_u is not null) return null; // finite U: no decoupled branch
        double t = _settings.Temperature;
        double fElectrons = 0;
        foreach (var g in _groups) fElectrons += g.Shells * g.Q;
        double remaining = _model.ElectronsPerCell - fElectrons;
        int conductionStates = _model.Orbitals.Count(o => o.Kind == OrbitalKind.Conduction) * _model.Flavours;
        if (remaining < 0 || remaining > conductionStates) return null;
        double far = 1e6 * (1 + Math.Abs(_groups.Max(g => Math.Abs(g.Level))));
        var x = new double[2 * G];
        for (int g = 0; g < G; g++) x[G + g] = far;
        // Only mu and Omega of the conduction states enter: energies suffice (the f levels sit far above).
        var table = _sum.FillEnergies(MeanFieldAmplitudes.Unpack(x));
        _passes++;
        var fill = BandFilling.Compute(table, remaining, t, tetrahedra: _tetra);
        double free = fill.GrandPotential + fill.Mu * remaining;
        var groups = new ShellGroupSolution[G];
        var lambda = new double[G];
        for (int g = 0; g < G; g++)
        {
            var s = _groups[g];
            double n = s.Degeneracy, q = s.Q;
            double entropy = n * Math.Log(n) - q * Math.Log(q) - (n - q) * Math.Log(n - q);
            free += s.Shells * (s.Level * q - t * entropy);
            double offset = t * Math.Log((n - q) / q);
            lambda[g] = fill.Mu + offset - s.Level;
            groups[g] = new(s.Name, s.Shells, 0, lambda[g], s.Level, offset, q);
        }
        return new SaddlePoint
        {
            Converged = true, Iterations = 0, ResidualNorm = 0, Temperature = t, Mu = fill.Mu, FreeEnergy = free,
            ElectronsPerCell = _model.ElectronsPerCell, Branch = SaddlePointBranch.Decoupled, Groups = groups,
            Amplitudes = new MeanFieldAmplitudes(new double[G], lambda), DecoupledFreeEnergy = free, FermiLevel = fill.Status, FermiWindow = fill.Window,
            Sampling = SamplingText(),
        };
    }
}
