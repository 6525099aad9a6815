namespace Meanfield.Solver;

/// <summary>
/// The result of filling a <see cref="StateTable"/> with N_e electrons per cell at temperature T: the chemical potential
/// mu, the band grand potential Omega_band = -T sum_n Avg_k ln(1 + e^{-(E - mu)/T}) per cell, and the thermal averages
/// n_f,g = sum f(E - mu) w_g and dOmega/dr_g = sum f(E - mu) dE/dr_g (energy unit, per cell). At T = 0 on a k-mesh
/// the Fermi function is replaced by the tetrahedron integration weights (<see cref="TetrahedronFilling"/>) and
/// Omega_band = sum w (E - mu).
/// </summary>
public sealed record BandFilling(double Mu, double GrandPotential, double[] FOccupation, double[] GrandPotentialSlope,
                                 FermiLevelStatus Status)
{
    /// <summary>
    /// At T = 0, every mu with N(mu) = N_e (mu is its middle; the occupations are the same anywhere inside); a single
    /// point for a metal. Null at T &gt; 0, where mu is unique.
    /// </summary>
    public FermiWindow? Window { get; init; }

    /// <summary>
    /// Finds mu with N(mu) = N_e: at T &gt; 0 by safeguarded Newton inside a bracket (N(mu) is monotone). At T = 0 with
    /// <paramref name="tetrahedra"/> (k-meshes) by the linear tetrahedron method with Bloechl's corrections; at T = 0
    /// without it (quadratures such as <see cref="LocalDosStateSum"/>) by ordering the states and placing mu midway
    /// between the last occupied and the first empty one (a state cut by the Fermi level is filled partially).
    /// </summary>
    /// <param name="table">The states; with <paramref name="tetrahedra"/> the full mesh in mesh order (k * bands + n).</param>
    /// <param name="electrons">N_e per cell, in [0, total weight of the table].</param>
    /// <param name="temperature">T &gt;= 0 in the energy unit.</param>
    /// <param name="muHint">A guess for mu (the last one of an iteration) that starts Newton; optional.</param>
    /// <param name="tetrahedra">The tetrahedron filling of the table's mesh, used at T = 0 only; optional.</param>
    /// <exception cref="RequestError">More electrons (the model's electrons_per_cell) than states.</exception>
    /// <exception cref="ArgumentException">A table that does not match the mesh.</exception>
    public static BandFilling Compute(StateTable table, double electrons, double temperature, double? muHint = null,
                                      TetrahedronFilling? tetrahedra = null)
    {
        if (temperature <= 0 && tetrahedra is not null) return ComputeTetrahedra(table, electrons, muHint, tetrahedra);
        double mu = temperature > 0 ? SolveMuThermal(table, electrons, temperature, muHint) : 0;
        int partial = -1; double fraction = 0;
        var status = FermiLevelStatus.Regular;
        FermiWindow? window = null;
        if (temperature <= 0) (mu, partial, fraction, status, window) = SolveMuGround(table, electrons);

        int g = table.Groups;
        var nf = new double[g]; var slope = new double[g];
        double omega = 0;
        for (int s = 0; s < table.Count; s++)
        {
            double x = table.Energy[s] - mu;
            double w = table.Weight[s];
            double f;
            // Far from mu the Fermi function is exactly 0 or 1 in doubles: skip the exponentials (same bits).
            if (temperature > 0 && s != partial && Math.Abs(x / temperature) > NoExponent)
            {
                if (x > 0) continue;
                f = 1; omega += w * x;
            }
            else
            {
                f = s == partial ? fraction : Numerics.FermiDirac.Occupation(x, temperature);
                omega += w * (s == partial ? fraction * x : Numerics.FermiDirac.GrandPotential(x, temperature));
            }
            if (f == 0) continue;
            double wf = w * f;
            int b = s * g;
            for (int q = 0; q < g; q++) { nf[q] += wf * table.FWeight[b + q]; slope[q] += wf * table.EnergySlope[b + q]; }
        }
        return new BandFilling(mu, omega, nf, slope, status) { Window = window };
    }

    /// <summary>T = 0 sums with tetrahedron weights: n_f = sum w f-weight, dOmega/dr = sum w dE/dr, Omega = sum w (E - mu).</summary>
    private static BandFilling ComputeTetrahedra(StateTable table, double electrons, double? muHint, TetrahedronFilling tetrahedra)
    {
        if (table.Count != tetrahedra.Weights.Length)
            throw new ArgumentException($"the state table holds {table.Count} states, the tetrahedron mesh {tetrahedra.Weights.Length}: it must be the full mesh");
        var result = tetrahedra.Solve(table.Energy, electrons, muHint);
        var weights = tetrahedra.Weights;
        double mu = result.Mu;
        int g = table.Groups;
        var nf = new double[g]; var slope = new double[g];
        double omega = 0;
        for (int s = 0; s < table.Count; s++)
        {
            double w = weights[s];
            if (w == 0) continue;
            omega += w * (table.Energy[s] - mu);
            int b = s * g;
            for (int q = 0; q < g; q++) { nf[q] += w * table.FWeight[b + q]; slope[q] += w * table.EnergySlope[b + q]; }
        }
        var status = Math.Abs(result.Electrons - electrons) > TetrahedronFilling.CountFailure * Math.Max(1.0, electrons)
            ? FermiLevelStatus.DegenerateAtFermiLevel : FermiLevelStatus.Regular;
        return new BandFilling(mu, omega, nf, slope, status) { Window = result.Window };
    }

    /// <summary>
    /// |E - mu| / T beyond which e^{-|E - mu|/T} is 0 in doubles (below half the smallest subnormal, e^-745.13), so
    /// occupations are exactly 0 or 1 there; skipping the exponential also skips libm's slow underflow path.
    /// </summary>
    private const double NoExponent = 746;

    private static double SolveMuThermal(StateTable table, double electrons, double t, double? hint)
    {
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        foreach (var e in table.Energy) { lo = Math.Min(lo, e); hi = Math.Max(hi, e); }
        lo -= 50 * t + 1e-9; hi += 50 * t + 1e-9;
        double mu = hint is { } h && h > lo && h < hi ? h : 0.5 * (lo + hi);
        double tolerance = 1e-13 * Math.Max(1.0, electrons);
        for (int it = 0; it < 200; it++)
        {
            var (n, dn) = CountAndSlope(table, mu, t);
            double r = n - electrons;
            if (Math.Abs(r) < tolerance) return mu;
            if (r > 0) hi = mu; else lo = mu;
            double next = dn > 0 ? mu - r / dn : double.NaN;
            mu = next > lo && next < hi ? next : 0.5 * (lo + hi);
            if (hi - lo < 1e-15 * Math.Max(1.0, Math.Abs(mu))) return mu;
        }
        return mu;
    }

    /// <summary>N(mu) and dN/dmu, one exponential per state, split over the cores.</summary>
    private static (double n, double dn) CountAndSlope(StateTable table, double mu, double t)
    {
        int chunks = Math.Max(1, Math.Min(Environment.ProcessorCount, table.Count / 65536 + 1));
        var partial = new double[2 * chunks];
        Parallel.For(0, chunks, c =>
        {
            int start = (int)((long)table.Count * c / chunks), end = (int)((long)table.Count * (c + 1) / chunks);
            double n = 0, dn = 0;
            var energy = table.Energy; var weight = table.Weight;
            for (int s = start; s < end; s++)
            {
                double x = (energy[s] - mu) / t, ax = Math.Abs(x);
                double e = ax > NoExponent ? 0 : Math.Exp(-ax), inv = 1 / (1 + e);
                n += weight[s] * (x > 0 ? e * inv : inv);
                dn += weight[s] * e * inv * inv;
            }
            partial[2 * c] = n; partial[2 * c + 1] = dn / t;
        });
        double sn = 0, sd = 0;
        for (int c = 0; c < chunks; c++) { sn += partial[2 * c]; sd += partial[2 * c + 1]; }
        return (sn, sd);
    }

    private static (double mu, int partial, double fraction, FermiLevelStatus status, FermiWindow window) SolveMuGround(StateTable table, double electrons)
    {
        var order = new int[table.Count];
        for (int i = 0; i < order.Length; i++) order[i] = i;
        var keys = (double[])table.Energy.Clone();
        Array.Sort(keys, order);
        double spread = keys[^1] - keys[0] + 1e-300;
        double cumulative = 0, tolerance = 1e-10 * Math.Max(1.0, electrons);
        if (electrons <= tolerance) return (keys[0] - 1e-9 * spread, -1, 0, FermiLevelStatus.Regular, new(keys[0] - 1e-9 * spread, keys[0] - 1e-9 * spread));
        for (int i = 0; i < order.Length; i++)
        {
            double w = table.Weight[order[i]];
            if (cumulative + w < electrons - tolerance) { cumulative += w; continue; }
            if (cumulative + w <= electrons + tolerance)
            {
                if (i + 1 == order.Length) return (keys[i] + 1e-9 * spread, -1, 0, FermiLevelStatus.Regular, new(keys[i] + 1e-9 * spread, keys[i] + 1e-9 * spread));
                double gap = keys[i + 1] - keys[i];
                var status = gap < 1e-9 * spread
                    ? FermiLevelStatus.DegenerateAtFermiLevel
                    : table.UniformWeights && gap < 1e-3 * spread ? FermiLevelStatus.InsideBand : FermiLevelStatus.Regular;
                return (0.5 * (keys[i] + keys[i + 1]), -1, 0, status, new(keys[i], keys[i + 1]));
            }
            // The Fermi level cuts this state: occupy it partially (a quadrature node of a continuous band).
            double fraction = (electrons - cumulative) / w;
            return (keys[i], order[i], fraction, table.UniformWeights ? FermiLevelStatus.InsideBand : FermiLevelStatus.Regular, new(keys[i], keys[i]));
        }
        throw new RequestError($"electrons_per_cell = {electrons:G6} exceeds the {table.TotalWeight():G6} states sampled");
    }
}
