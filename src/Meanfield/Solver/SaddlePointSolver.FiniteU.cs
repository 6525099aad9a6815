using Meanfield.Binding;
using Meanfield.Renormalization;

namespace Meanfield.Solver;

/// <summary>
/// The finite-U saddle point: paramagnetic four-boson mean field of Kotliar &amp; Ruckenstein, PRL 57, 1362 (1986), on N = 2
/// shells. Per group the bosons e (empty), p (single, equal for both spins: time reversal), d (double) obey completeness
/// e^2 + 2 p^2 + d^2 = 1, which fixes p; the f level is shifted by lambda, the multiplier of n_f = 2 (p^2 + d^2); the
/// correlated orbital's bonds carry q = p (e + d) / sqrt((n/2)(1 - n/2)) per f operator (their Eq. 5, normalized so that
/// q = 1 at U = 0), so the band pass is the infinite-U one with r = q. Per shell
///   F = Omega_band(q, lambda) - lambda n_b + U d^2 + mu N_e,   n_b = 2 (p^2 + d^2) = 1 - e^2 + d^2,
/// stationary in (e, d, lambda):
///   n_f - n_b = 0,   Omega' dq/de + 2 lambda e = 0,   Omega' dq/dd - 2 lambda d + 2 U d = 0   (Omega' = dOmega/dq).
/// The unknowns are y = (ln S, t, lambda/E0) per group with S = e + d and t = d / S (e = (1 - t) S, d = t S): in the
/// Kondo regime e and d vanish together, exponentially like r at infinite U, at a fixed share t = (mu - eps_f) / U
/// (derived in tests/Meanfield.Tests/FiniteU), so ln S carries the small scale and t stays of order one; iterating ln e
/// and ln d separately instead leaves plateaus at e -&gt; 0 where Newton drifts. Points with t outside [0, 1] or
/// e^2 + d^2 &gt;= 1 (p^2 &lt;= 0) are outside the physical region, and the line search steps back from them. The two
/// stationarity residuals are divided by q E0 (both terms vanish linearly with q).
/// The same Newton/Broyden iteration, mesh plan, mu at fixed N and convergence test run as at infinite U.
/// </summary>
public sealed partial class SaddlePointSolver
{
    /// <summary>U per shell group (all finite), or null for the infinite-U solver.</summary>
    private readonly double[]? _u;

    /// <summary>True when the groups are four-boson (finite-U) shells.</summary>
    public bool IsFiniteU => _u is not null;

    /// <summary>U per group when every shell has a finite U; null when none has. Mixtures and unsupported shells are refused.</summary>
    private static double[]? FiniteUGroups(BoundModel model, IReadOnlyList<string> names)
    {
        int finite = model.Shells.Count(s => s.HasFiniteU);
        if (finite == 0) return null;
        if (finite != model.Shells.Count)
            throw new RequestError("finite U is given on some shells and not on others: the lattice solver treats every shell at finite U or every shell at infinite U; give U on every shell or on none");
        if (model.Flavours != 2)
            throw new RequestError($"finite U needs N = 2 flavours (the four-boson shell of Kotliar & Ruckenstein), the model has {model.Flavours}");
        // The four-boson mean field here is paramagnetic (p_up = p_down), which time reversal guarantees; a Zeeman
        // field breaks it and would need spin-resolved bosons.
        if (model.Onsite.FirstOrDefault(o => o.Source.StartsWith("zeeman", StringComparison.Ordinal)) is { } zeeman)
            throw new RequestError("finite U with a Zeeman field is not solved: the four-boson mean field here is paramagnetic (equal p for both spins); remove [zeeman] or omit U for infinite U");
        var u = new double[names.Count];
        for (int g = 0; g < names.Count; g++)
        {
            var shells = model.Shells.Where(s => s.Group == names[g]).ToList();
            if (shells.Any(s => s.U != shells[0].U))
                throw new RequestError($"shell group '{names[g]}': all its shells need the same U");
            if (!(shells[0].U >= 0) || double.IsInfinity(shells[0].U))
                throw new RequestError($"shell group '{names[g]}': U = {shells[0].U:G6} must be finite and >= 0");
            u[g] = shells[0].U;
        }
        return u;
    }

    /// <summary>The four-boson amplitudes of group g at y (null outside the physical region).</summary>
    private FourBosonAmplitudes? BosonsAt(double[] y, int g)
    {
        double sum = Math.Exp(y[g]), t = y[G + g];
        return t is >= 0 and <= 1 ? FourBosonAmplitudes.FromEmptyAndDouble((1 - t) * sum, t * sum) : null;
    }

    /// <summary>x = (e, d, lambda) per group to y = (ln(e + d), d/(e + d), lambda/E0).</summary>
    private double[] FiniteToIterationVector(double[] x)
    {
        var y = new double[x.Length];
        for (int g = 0; g < G; g++)
        {
            double sum = Math.Max(x[g] + x[G + g], 1e-300);
            y[g] = Math.Log(sum); y[G + g] = x[G + g] / sum; y[2 * G + g] = x[2 * G + g] / _energyScale;
        }
        return y;
    }

    /// <summary>y = (ln S, t, lambda/E0) to x = (e, d, lambda) per group.</summary>
    private double[] FiniteToBosonVector(double[] y)
    {
        var x = new double[y.Length];
        for (int g = 0; g < G; g++)
        {
            double sum = Math.Exp(y[g]), t = y[G + g];
            x[g] = (1 - t) * sum; x[G + g] = t * sum; x[2 * G + g] = y[2 * G + g] * _energyScale;
        }
        return x;
    }

    /// <summary>
    /// A start heading into a corner of the four-boson region: some group's q below 1e-3 while the residual no longer
    /// falls (its e or d creeping to 0 on a plateau). The next start is tried instead.
    /// </summary>
    private bool FiniteCollapsing(double[] y, List<double> history)
    {
        if (history.Count <= 4 || !(history[^1] > 0.7 * history[^5])) return false;
        for (int g = 0; g < G; g++)
            if (BosonsAt(y, g) is not { } b || b.FactorWithSlopes().Q < 1e-3) return true;
        return false;
    }

    /// <summary>y = (ln S, t, lambda/E0) to the amplitudes of the band pass (r = q, lambda); null outside the physical region.</summary>
    private MeanFieldAmplitudes? FiniteAmplitudes(double[] y)
    {
        var r = new double[G]; var lambda = new double[G];
        for (int g = 0; g < G; g++)
        {
            if (BosonsAt(y, g) is not { } b) return null;
            r[g] = b.FactorWithSlopes().Q; lambda[g] = y[2 * G + g] * _energyScale;
        }
        return new MeanFieldAmplitudes(r, lambda);
    }

    /// <summary>Scaled residuals (n_f - n_b, stationarity in e and d divided by q E0) at y; NaN outside the physical region.</summary>
    private (double[] residual, BandFilling filling) EvaluateFinite(double[] y)
    {
        var res = new double[3 * G];
        if (FiniteAmplitudes(y) is not { } amp)
        {
            Array.Fill(res, double.NaN);
            return (res, _lastFill ?? new BandFilling(0, 0, new double[G], new double[G], FermiLevelStatus.Regular));
        }
        var table = _sum.Fill(amp);
        _lastTable = table;
        _passes++;
        var fill = BandFilling.Compute(table, _model.ElectronsPerCell, _settings.Temperature, _lastMu, _tetra);
        _lastMu = fill.Mu; _lastFill = fill;
        for (int g = 0; g < G; g++)
        {
            var b = BosonsAt(y, g)!.Value;
            var (q, dqde, dqdd) = b.FactorWithSlopes();
            double m = _groups[g].Shells, lambda = amp.Lambda[g], w = fill.GrandPotentialSlope[g] / m;
            res[g] = fill.FOccupation[g] / m - b.Filling;
            res[G + g] = (w * dqde + 2 * lambda * b.E) / (q * _energyScale);
            res[2 * G + g] = (w * dqdd - 2 * lambda * b.D + 2 * _u![g] * b.D) / (q * _energyScale);
        }
        return (res, fill);
    }

    private BandFilling? _lastFill;

    /// <summary>The residuals the convergence test judges at finite U: n_f - n_b as it is, dF/de and dF/dd over E0.</summary>
    private double[] RelativeFinite(double[] y, double[] res)
    {
        var rel = (double[])res.Clone();
        for (int g = 0; g < G; g++)
        {
            double q = BosonsAt(y, g) is { } b ? b.FactorWithSlopes().Q : double.NaN;
            rel[G + g] *= q; rel[2 * G + g] *= q;
        }
        return rel;
    }

    /// <summary>
    /// The analytic Jacobian of the finite-U residuals in y = (ln S, t, lambda/E0), by the chain rule from the band
    /// sums' derivatives with respect to (r, lambda) (<see cref="ISaddlePointDerivatives"/>, r = q(e, d)) and the closed
    /// form of q; the second derivatives of q are central differences of its closed-form slopes (no band pass).
    /// With A = Omega' q_e + 2 lambda e, B = Omega' q_d - 2 lambda d + 2 U d (per shell) and R = A/(q E0):
    /// dR/dx = (dA/dx - R E0 dq/dx)/(q E0) for x = e, d; then d/d ln S = e d/de + d d/dd and d/dt = S (d/dd - d/de).
    /// Null where the infinite-U Jacobian is unavailable.
    /// </summary>
    private double[]? AnalyticJacobianFinite(double[] y, double[] res, BandFilling fill)
    {
        if (_sum is not ISaddlePointDerivatives d) return null;
        double t = _settings.Temperature;
        if (t <= 0 && (fill.Status != FermiLevelStatus.Regular || _lastTable is not { } table || StateAtMu(table, fill.Mu))) return null;
        int n2 = 2 * G, n = 3 * G;
        var raw = new double[n2 * n2];
        if (!d.TryDerivatives(fill.Mu, t, raw)) return null;
        var q = new double[G]; var qe = new double[G]; var qd = new double[G];
        var qee = new double[G]; var qed = new double[G]; var qdd = new double[G];
        var e = new double[G]; var dd = new double[G];
        for (int g = 0; g < G; g++)
        {
            if (BosonsAt(y, g) is not { } b) return null;
            e[g] = b.E; dd[g] = b.D;
            (q[g], qe[g], qd[g]) = b.FactorWithSlopes();
            // Central differences of the closed-form slopes; a step that leaves the region falls back to one side.
            double he = 1e-6 * Math.Max(b.E, 1e-3), hd = 1e-6 * Math.Max(b.D, 1e-3);
            var (pe, me) = (Slopes(b.E + he, b.D), Slopes(Math.Max(b.E - he, 0), b.D));
            var (pd, md) = (Slopes(b.E, b.D + hd), Slopes(b.E, Math.Max(b.D - hd, 0)));
            if (pe is null || me is null || pd is null || md is null) return null;
            double se = b.E + he - Math.Max(b.E - he, 0), sd = b.D + hd - Math.Max(b.D - hd, 0);
            qee[g] = (pe.Value.e - me.Value.e) / se;
            qed[g] = 0.5 * ((pe.Value.d - me.Value.d) / se + (pd.Value.e - md.Value.e) / sd);
            qdd[g] = (pd.Value.d - md.Value.d) / sd;
        }
        // Columns in (e_h, d_h, lambda_h/E0) first.
        var je = new double[n * G]; var jd = new double[n * G];
        var j = new double[n * n];
        for (int g = 0; g < G; g++)
        {
            double m = _groups[g].Shells, lambda = y[2 * G + g] * _energyScale, w = fill.GrandPotentialSlope[g] / m, u = _u![g];
            double ra = res[G + g], rb = res[2 * G + g], scale = q[g] * _energyScale;
            for (int h = 0; h < G; h++)
            {
                double delta = g == h ? 1 : 0;
                double dNe = raw[g * n2 + h] * qe[h] / m, dNd = raw[g * n2 + h] * qd[h] / m, dNc = raw[g * n2 + G + h] * _energyScale / m;
                double dWe = raw[(G + g) * n2 + h] * qe[h] / m, dWd = raw[(G + g) * n2 + h] * qd[h] / m;
                double dWc = raw[(G + g) * n2 + G + h] * _energyScale / m;
                // n_b = 1 - e^2 + d^2.
                je[g * G + h] = dNe + delta * 2 * e[g];
                jd[g * G + h] = dNd - delta * 2 * dd[g];
                j[g * n + 2 * G + h] = dNc;
                double dqe = delta * qe[g], dqd = delta * qd[g];
                double dAe = dWe * qe[g] + delta * (w * qee[g] + 2 * lambda), dAd = dWd * qe[g] + delta * w * qed[g];
                double dBe = dWe * qd[g] + delta * w * qed[g], dBd = dWd * qd[g] + delta * (w * qdd[g] - 2 * lambda + 2 * u);
                je[(G + g) * G + h] = (dAe - ra * _energyScale * dqe) / scale;
                jd[(G + g) * G + h] = (dAd - ra * _energyScale * dqd) / scale;
                j[(G + g) * n + 2 * G + h] = (dWc * qe[g] + delta * 2 * e[g] * _energyScale) / scale;
                je[(2 * G + g) * G + h] = (dBe - rb * _energyScale * dqe) / scale;
                jd[(2 * G + g) * G + h] = (dBd - rb * _energyScale * dqd) / scale;
                j[(2 * G + g) * n + 2 * G + h] = (dWc * qd[g] - delta * 2 * dd[g] * _energyScale) / scale;
            }
        }
        for (int row = 0; row < n; row++)
            for (int h = 0; h < G; h++)
            {
                double sum = e[h] + dd[h];
                j[row * n + h] = e[h] * je[row * G + h] + dd[h] * jd[row * G + h];
                j[row * n + G + h] = sum * (jd[row * G + h] - je[row * G + h]);
            }
        return j;

        static (double e, double d)? Slopes(double e, double d) =>
            FourBosonAmplitudes.FromEmptyAndDouble(e, d) is { } b ? (b.FactorWithSlopes().DqDe, b.FactorWithSlopes().DqDd) : null;
    }

    /// <summary>
    /// Built-in finite-U starts: a neighbour's (r, lambda) (scans, temperature sweeps) turned into bosons at its f
    /// occupation, then the uncorrelated point at the bare f occupation (exact at U = 0), then increasingly correlated
    /// points near n_f = 1 with the f level placed at mu (the Kondo regime).
    /// </summary>
    private IEnumerable<double[]> GuessesFinite()
    {
        if (_settings.InitialGuess is { } guess && guess.GroupCount == G && FromNeighbour(guess) is { } warm) yield return warm;
        var bare = MeanFieldAmplitudes.Bare(G);
        var fill0 = BandFilling.Compute(_sum.Fill(bare), _model.ElectronsPerCell, _settings.Temperature, _lastMu, _tetra);
        _passes++;
        var x = new double[3 * G];
        for (int g = 0; g < G; g++)
        {
            double n = Math.Clamp(fill0.FOccupation[g] / _groups[g].Shells, 0.05, 1.95);
            x[g] = 1 - 0.5 * n; x[G + g] = 0.5 * n; x[2 * G + g] = 0;
        }
        yield return x;
        foreach (var (n, dbl) in new[] { (0.9, 0.02), (0.97, 2e-3), (0.995, 2e-4) })
        {
            var c = new double[3 * G];
            for (int g = 0; g < G; g++) { c[g] = Math.Sqrt(1 - n + dbl); c[G + g] = Math.Sqrt(dbl); c[2 * G + g] = fill0.Mu - _groups[g].Level; }
            yield return c;
        }
    }

    /// <summary>
    /// Bosons from a neighbouring solution's (r, lambda): one band pass gives n_f, and d^2 is the root of q(n_f, d^2) = r
    /// on the physical branch d^2 in [max(0, n - 1), (n/2)^2], where q rises monotonically to 1 (bisection).
    /// </summary>
    private double[]? FromNeighbour(MeanFieldAmplitudes guess)
    {
        var fill = BandFilling.Compute(_sum.Fill(guess), _model.ElectronsPerCell, _settings.Temperature, _lastMu, _tetra);
        _passes++;
        var x = new double[3 * G];
        for (int g = 0; g < G; g++)
        {
            double n = fill.FOccupation[g] / _groups[g].Shells, r = guess.R[g];
            if (!(n > 1e-6 && n < 2 - 1e-6) || !(r > 0)) return null;
            double lo = FourBosonAmplitudes.MinDouble(n), hi = 0.25 * n * n;
            if (r >= 1) lo = hi;
            for (int i = 0; i < 100 && hi - lo > 1e-15; i++)
            {
                double mid = 0.5 * (lo + hi);
                if (Math.Sqrt(FourBosonAmplitudes.At(n, mid).Z) < r) lo = mid; else hi = mid;
            }
            var b = FourBosonAmplitudes.At(n, 0.5 * (lo + hi));
            if (!(b.E > 0 && b.D > 0)) return null;
            x[g] = b.E; x[G + g] = b.D; x[2 * G + g] = guess.Lambda[g];
        }
        return x;
    }

    /// <summary>The finite-U result: no decoupled branch (the bosons cannot all vanish), free energy with U d^2.</summary>
    private SaddlePoint FinishFinite(Attempt a)
    {
        var y = ToIterationVector(a.X);
        var amp = FiniteAmplitudes(y)!;
        var notes = new List<string>();
        if (!a.Converged)
        {
            notes.Add(a.Stalled
                ? $"the iteration stalled at residual {a.Residual:G3} (no step lowered it)."
                : $"the iteration cap of {_settings.MaxIterations} was reached at residual {a.Residual:G3}.");
            if (_settings.Temperature <= 0 && a.Filling.Status != FermiLevelStatus.Regular)
                notes.Add("T = 0 with states at the Fermi level: occupations jump between iterations. Use a small temperature (for example --temperature 1K).");
            else
                notes.Add("try more iterations (--max-iterations), a looser --tolerance, a starting point from a neighbouring solution, or a small temperature.");
        }
        var groups = new ShellGroupSolution[G];
        double f = a.Filling.GrandPotential + a.Filling.Mu * _model.ElectronsPerCell;
        for (int g = 0; g < G; g++)
        {
            var b = BosonsAt(y, g)!.Value;
            var s = _groups[g];
            f += s.Shells * (-amp.Lambda[g] * b.Filling + _u![g] * b.D * b.D);
            groups[g] = new(s.Name, s.Shells, amp.R[g], amp.Lambda[g], s.Level, s.Level + amp.Lambda[g] - a.Filling.Mu,
                            a.Filling.FOccupation[g] / s.Shells, _u[g], b);
        }
        return new SaddlePoint
        {
            Converged = a.Converged, Iterations = a.Iterations, ResidualNorm = a.Residual, Temperature = _settings.Temperature,
            Mu = a.Filling.Mu, FreeEnergy = f, ElectronsPerCell = _model.ElectronsPerCell, Branch = SaddlePointBranch.Kondo,
            Groups = groups, Amplitudes = amp, FermiLevel = a.Filling.Status, FermiWindow = a.Filling.Window,
            Sampling = SamplingText() + "; finite U (four bosons)", Notes = notes,
        };
    }

    /// <summary>
    /// For checks and solution files: the finite-U residuals at bosons (e, d) and multipliers lambda per group, as the
    /// convergence test judges them (n_f - n_b; dF/de and dF/dd over the model's largest energy), and the filling there.
    /// </summary>
    /// <exception cref="InvalidOperationException">The solver is infinite-U.</exception>
    /// <exception cref="ArgumentException">Bosons outside the physical region or the wrong count.</exception>
    public (double[] Residual, BandFilling Filling) FiniteUResiduals(IReadOnlyList<FourBosonAmplitudes> bosons, IReadOnlyList<double> lambda)
    {
        if (_u is null) throw new InvalidOperationException("the model is solved at infinite U: there are no four-boson residuals");
        if (bosons.Count != G || lambda.Count != G) throw new ArgumentException($"one boson set and one lambda per shell group ({G}) are needed");
        var x = new double[3 * G];
        for (int g = 0; g < G; g++) { x[g] = bosons[g].E; x[G + g] = bosons[g].D; x[2 * G + g] = lambda[g]; }
        var y = ToIterationVector(x);
        var (res, fill) = EvaluateFinite(y);
        if (double.IsNaN(res[0])) throw new ArgumentException("the bosons lie outside the physical region (need e, d > 0 and e^2 + d^2 < 1)");
        return (RelativeFinite(y, res), fill);
    }
}
