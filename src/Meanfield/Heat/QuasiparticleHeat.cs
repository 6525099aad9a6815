namespace Meanfield.Heat;

/// <summary>
/// Electronic heat capacity and entropy of non-interacting quasiparticles with a tabulated DOS, at fixed electron count.
/// </summary>
/// <remarks>
/// With U = Int E rho f dE and N = Int rho f dE fixed, df/dT = f(1-f) [(E-mu)/T^2 + mu'/T]. dN/dT = 0 gives
/// mu' = -I1/(T I0) and C = dU/dT = (1/T)[I2 + T mu' I1] = (1/T)[I2 - I1^2/I0] with I_k = Int rho (E-mu)^k f(1-f) dE / T
/// (Ashcroft &amp; Mermin, Solid State Physics (1976), ch. 2, eqs. 2.70-2.80, generalised to a non-flat DOS).
/// In the quadrature's variables (x = (E-mu)/T) this is C = A2 - A1^2/A0 and mu' = -A1/A0.
/// Entropy of independent fermions: S = -Int rho [f ln f + (1-f) ln(1-f)] dE (Landau &amp; Lifshitz, Statistical Physics
/// Part 1 (1980), sec. 55).
/// </remarks>
public sealed class QuasiparticleHeat
{
    public QuasiparticleHeat(TabulatedDos dos) => Dos = dos;

    public TabulatedDos Dos { get; }

    /// <summary>Thermodynamics at <paramref name="temperatureK"/> (K, positive).</summary>
    public ThermalPoint At(double temperatureK)
    {
        if (!(temperatureK > 0) || !double.IsFinite(temperatureK))
            throw new ArgumentOutOfRangeException(nameof(temperatureK), temperatureK, "temperature must be positive (K)");
        double t = HeatUnits.ToEnergy(temperatureK, Dos.Unit);
        double mu = ChemicalPotential(t);
        var m = FermiWindowQuadrature.Evaluate(Dos, mu, t);
        double c = m.A0 > 0 ? m.A2 - m.A1 * m.A1 / m.A0 : 0;
        double slope = m.A0 > 0 ? -m.A1 / m.A0 : 0;
        double fu = Dos.FormulaUnitsPerCell;
        return new ThermalPoint(temperatureK, mu, slope, c, m.Entropy,
                                HeatUnits.MolarFromPerCell(c, fu), HeatUnits.MolarFromPerCell(m.Entropy, fu));
    }

    /// <summary>Molar heat capacity C(T) (J mol^-1 K^-1) at each temperature (K).</summary>
    public HeatCurve Curve(IReadOnlyList<double> temperaturesK)
    {
        var c = new double[temperaturesK.Count];
        for (int i = 0; i < c.Length; i++) c[i] = At(temperaturesK[i]).MolarHeatCapacity;
        return new HeatCurve(temperaturesK, c);
    }

    /// <summary>
    /// mu at temperature <paramref name="temperature"/> (DOS energy unit) from Int rho f = N_e: Newton steps with the
    /// exact slope dN/dmu = A0/T, kept inside a bracket that shrinks with each evaluation (bisection when a step leaves it).
    /// </summary>
    public double ChemicalPotential(double temperature)
    {
        double t = temperature, width = FermiWindowQuadrature.WindowHalfWidth * t;
        double lo = Dos.MinEnergy - width, hi = Dos.MaxEnergy + width;
        double scale = Math.Max(Math.Abs(Dos.MinEnergy), Math.Abs(Dos.MaxEnergy));
        double tol = Math.Max(1e-12 * t, 4e-16 * scale);
        double mu = Math.Clamp(Dos.GroundStateFermiLevel(), lo, hi);
        for (int it = 0; it < 300; it++)
        {
            var m = FermiWindowQuadrature.Evaluate(Dos, mu, t);
            double excess = Dos.StatesBelow(mu) + m.ThermalCount - Dos.ElectronsPerCell;
            if (excess == 0) return mu;
            if (excess > 0) hi = mu; else lo = mu;
            double slope = m.A0 / t;
            double next = slope > 0 ? mu - excess / slope : double.NaN;
            if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
            if (Math.Abs(next - mu) < tol || hi - lo < tol) return next;
            mu = next;
        }
        throw new InvalidOperationException($"chemical potential did not converge at T = {t} (energy unit)");
    }
}
