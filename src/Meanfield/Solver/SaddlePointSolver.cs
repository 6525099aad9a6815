using System.Diagnostics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Renormalization;
using Meanfield.Symmetry;

namespace Meanfield.Solver;

/// <summary>
/// Solves the infinite-U auxiliary-boson saddle point (Newns &amp; Read, Adv. Phys. 36, 799 (1987); Hewson, The Kondo
/// Problem to Heavy Fermions (1993), ch. 7): for every shell group g,
///   n_f,g + r_g^2 = Q                  (constraint, dF/dlambda_g = 0)
///   &lt;dH_MF/dr_g&gt; + 2 lambda_g r_g = 0  (dF/dr_g = 0, Hellmann-Feynman)
/// per shell, with mu fixed by the electron count at every evaluation (<see cref="BandFilling"/>). The 2G unknowns
/// (r, lambda) are iterated by Broyden's method (Broyden, Math. Comp. 19, 577 (1965)) from a finite-difference
/// Jacobian, with a backtracking line search; the Jacobian is rebuilt when a step fails. Models whose shells all have a
/// finite U are solved by the four-boson equations of SaddlePointSolver.FiniteU.cs through the same iteration.
/// </summary>
public sealed partial class SaddlePointSolver
{
    private readonly BoundModel _model;
    private readonly SolverSettings _settings;
    private readonly IStateSum _sum;
    private readonly GroupInfo[] _groups;
    private int _passes;
    private readonly double _energyScale;
    private double? _lastMu;
    /// <summary>T = 0 on a k-mesh: tetrahedron weights replace the step occupations (null otherwise).</summary>
    private readonly TetrahedronFilling? _tetra;

    private sealed record GroupInfo(string Name, int Shells, double Q, double Level, int Degeneracy);

    public BlochHamiltonian Bare { get; }
    public IStateSum StateSum => _sum;

    /// <summary>A solver of <paramref name="model"/>'s saddle point with <paramref name="settings"/>.</summary>
    /// <exception cref="RequestError">Settings out of range, or a model with no saddle point to solve here: no correlated
    /// shell, a finite U, a shell group of unequal N and Q or with Q outside (0, N), an impossible electron count, or a
    /// mesh too large for the machine.</exception>
    /// <exception cref="ArgumentException">A [solver] symmetry operation the model breaks.</exception>
    public SaddlePointSolver(BoundModel model, SolverSettings settings) : this(model, settings, null, null) { }

    /// <summary>
    /// A solver that shares what it can with earlier solves through <paramref name="reuse"/> (the points of a scan
    /// segment): the symmetry group when it still holds, the wedges and the state buffers; results are the same.
    /// </summary>
    /// <exception cref="RequestError">As for the constructor without reuse.</exception>
    /// <exception cref="ArgumentException">A [solver] symmetry operation the model breaks.</exception>
    public SaddlePointSolver(BoundModel model, SolverSettings settings, SolveReuse? reuse) : this(model, settings, null, reuse) { }

    private readonly SolveReuse? _reuse;

    /// <summary>A solver that reuses a symmetry group already found for the same model (the half-mesh start).</summary>
    private SaddlePointSolver(BoundModel model, SolverSettings settings, SymmetryGroup? group, SolveReuse? reuse)
    {
        _reuse = reuse;
        settings.Validate();
        _model = model; _settings = settings;
        Bare = new BlochHamiltonian(model);
        if (model.Shells.Count == 0) throw new RequestError("the model has no correlated shell: there is no saddle point to solve");
        var names = model.ShellGroups();
        _u = FiniteUGroups(model, names);
        _groups = new GroupInfo[names.Count];
        for (int g = 0; g < names.Count; g++)
        {
            var shells = model.Shells.Where(s => s.Group == names[g]).ToList();
            if (shells.Any(s => s.Constraint != shells[0].Constraint || s.Degeneracy != shells[0].Degeneracy))
                throw new RequestError($"shell group '{names[g]}': all its shells need the same N and Q");
            var q = shells[0].Constraint;
            // Q belongs to the infinite-U boson; the four bosons of a finite-U shell obey completeness instead.
            if (_u is null && !(q > 0 && q < shells[0].Degeneracy))
                throw new RequestError($"shell group '{names[g]}': the constraint Q = {q} cannot be met by N = {shells[0].Degeneracy} f states and a boson (need 0 < Q < N)");
            _groups[g] = new GroupInfo(names[g], shells.Count, q, shells[0].Level, shells[0].Degeneracy);
        }
        _energyScale = 1.0;
        foreach (var s in model.Shells) _energyScale = Math.Max(_energyScale, Math.Abs(s.Level));
        foreach (var h in model.Hoppings) _energyScale = Math.Max(_energyScale, h.Amplitude.MaxAbs());
        if (model.ElectronsPerCell < 0 || model.ElectronsPerCell > model.StatesPerCell)
            throw new RequestError($"electrons_per_cell = {model.ElectronsPerCell} is impossible: the cell has {model.StatesPerCell} states");
        if (model.IsMomentumFree) _sum = new LocalDosStateSum(Bare, settings.DosNodes);
        else
        {
            // The T = 0 tetrahedron filling needs every corner of the full mesh in index order: no wedge reduction there.
            var request = settings.Temperature <= 0 ? SymmetryRequest.None : settings.Symmetry;
            group ??= reuse is null ? SymmetryGroup.Find(Bare, request) : reuse.Group(Bare, request);
            _group = group;
            bool keep = MeshMemory.Check(model, settings, group, out var mesh) && settings.AnalyticJacobian;
            var wedge = reuse is null ? new IrreducibleMesh(mesh, group) : reuse.Wedge(mesh, group);
            var bare = Bare;
            bool parts = keep && MeshMemory.PartsFit(model, settings, group);
            var sum = reuse is null ? new MeshStateSum(bare, wedge, keep, parts, null) : reuse.Sum(wedge, last => new MeshStateSum(bare, wedge, keep, parts, last));
            _sum = sum;
            var ir = sum.Irreducible;
            _reduction = new MeshReduction(group.Order, group.UnitaryCount, ir.ActionCount, mesh.Count, ir.Count,
                                           [.. group.Operations.Select(o => o.Name)]);
            if (settings.Temperature <= 0) _tetra = new TetrahedronFilling(sum.Mesh, Bare.Size);
        }
    }

    private readonly MeshReduction? _reduction;
    private readonly SymmetryGroup? _group;

    /// <summary>How symmetry reduced the mesh (null for momentum-free lattices).</summary>
    public MeshReduction? Reduction => _reduction;

    /// <summary>The T = 0 tetrahedron filling of the k-mesh, or null (T &gt; 0, or a momentum-free lattice).</summary>
    public TetrahedronFilling? Tetrahedra => _tetra;

    private int G => _groups.Length;

    /// <summary>
    /// Residuals at y = (ln r, lambda), the variables the iteration runs in: ln r keeps r positive and spreads the
    /// exponentially small Kondo scales evenly. The stationarity equation is divided by r there (both terms are
    /// proportional to r near r = 0), which keeps the Jacobian regular; <see cref="Unscaled"/> restores the equations.
    /// </summary>
    private (double[] residual, BandFilling filling) EvaluateLog(double[] y)
    {
        if (_u is not null) return EvaluateFinite(y);
        var (res, fill) = Evaluate(ToAmplitudeVector(y));
        for (int g = 0; g < G; g++) res[G + g] /= Math.Exp(y[g]) * _energyScale;
        return (res, fill);
    }

    /// <summary>y = (ln r, lambda / E0) to x = (r, lambda); E0 makes the multiplier and the residuals dimensionless.</summary>
    private double[] ToAmplitudeVector(double[] y)
    {
        if (_u is not null) return FiniteToBosonVector(y);
        var x = new double[y.Length];
        for (int g = 0; g < G; g++) { x[g] = Math.Exp(y[g]); x[G + g] = y[G + g] * _energyScale; }
        return x;
    }

    private double[] ToIterationVector(double[] x)
    {
        if (_u is not null) return FiniteToIterationVector(x);
        var y = new double[x.Length];
        for (int g = 0; g < G; g++) { y[g] = Math.Log(Math.Max(x[g], 1e-300)); y[G + g] = x[G + g] / _energyScale; }
        return y;
    }

    /// <summary>The residuals a result reports: the unscaled equations at infinite U, the judged ones at finite U.</summary>
    private double[] Reported(double[] y, double[] scaled) => _u is null ? Unscaled(y, scaled) : RelativeFinite(y, scaled);

    /// <summary>The residuals the convergence test judges (dimensionless) from the iteration's scaled ones.</summary>
    private double[] Judged(double[] y, double[] scaled) => _u is null ? Relative(Unscaled(y, scaled)) : RelativeFinite(y, scaled);

    /// <summary>
    /// The residuals as the convergence test judges them: constraints as they are (dimensionless), stationarity divided by
    /// the model's largest energy E0, so that the same tolerance means the same thing at every energy scale.
    /// </summary>
    private double[] Relative(double[] unscaled)
    {
        var rel = (double[])unscaled.Clone();
        for (int g = 0; g < G; g++) rel[G + g] /= _energyScale;
        return rel;
    }

    private double[] Unscaled(double[] y, double[] scaledResidual)
    {
        var res = (double[])scaledResidual.Clone();
        for (int g = 0; g < G; g++) res[G + g] *= Math.Exp(y[g]) * _energyScale;
        return res;
    }

    /// <summary>Residuals of the 2G equations at x = (r, lambda), and the filling there.</summary>
    private (double[] residual, BandFilling filling) Evaluate(double[] x)
    {
        var amp = MeanFieldAmplitudes.Unpack(x);
        var table = _sum.Fill(amp);
        _lastTable = table;
        _passes++;
        var fill = BandFilling.Compute(table, _model.ElectronsPerCell, _settings.Temperature, _lastMu, _tetra);
        _lastMu = fill.Mu;
        var res = new double[2 * G];
        for (int g = 0; g < G; g++)
        {
            double r = amp.R[g], m = _groups[g].Shells;
            res[g] = fill.FOccupation[g] / m + r * r - _groups[g].Q;
            res[G + g] = fill.GrandPotentialSlope[g] / m + 2 * amp.Lambda[g] * r;
        }
        return (res, fill);
    }

    private double FreeEnergy(MeanFieldAmplitudes amp, BandFilling fill)
    {
        double f = fill.GrandPotential + fill.Mu * _model.ElectronsPerCell;
        for (int g = 0; g < G; g++) f += _groups[g].Shells * amp.Lambda[g] * (amp.R[g] * amp.R[g] - _groups[g].Q);
        return f;
    }

    /// <summary>Free energy F(r, lambda) per cell with mu fixed by the electron count (for stationarity checks).</summary>
    /// <exception cref="InvalidOperationException">A finite-U model (its free energy needs the four bosons, see the solution).</exception>
    public double FreeEnergyAt(MeanFieldAmplitudes amp)
    {
        if (_u is not null) throw new InvalidOperationException("F(r, lambda) is the infinite-U free energy; a finite-U solution reports its own");
        var fill = BandFilling.Compute(_sum.Fill(amp), _model.ElectronsPerCell, _settings.Temperature, tetrahedra: _tetra);
        return FreeEnergy(amp, fill);
    }

    private static double MaxAbs(double[] v) { double m = 0; foreach (var a in v) m = Math.Max(m, Math.Abs(a)); return m; }
    private static double Norm(double[] v) { double m = 0; foreach (var a in v) m += a * a; return Math.Sqrt(m); }

    private double[] Jacobian(double[] x, double[] res)
    {
        int n = x.Length;
        var j = new double[n * n];
        for (int c = 0; c < n; c++)
        {
            double h = 1e-6 * Math.Max(1.0, Math.Abs(x[c]));
            var xp = (double[])x.Clone(); xp[c] += h;
            var (rp, _) = EvaluateLog(xp);
            for (int r = 0; r < n; r++) j[r * n + c] = (rp[r] - res[r]) / h;
        }
        return j;
    }

    /// <summary>Newton steps that failed their line search and handed over to Broyden (over the solver's life).</summary>
    public int NewtonFallbacks { get; private set; }

    /// <summary>
    /// The analytic Jacobian of the scaled residuals in y = (ln r, lambda/E0) at the last evaluated point (its pass's
    /// eigenstates, <see cref="ISaddlePointDerivatives"/>). With m_g shells per group, R1_g = n_f,g/m_g + r_g^2 - Q and
    /// R2s_g = (Omega'_g/m_g + 2 lambda_g r_g)/(r_g E0):
    ///   dR1_g/dy_h = r_h (dn_f,g/dr_h / m_g + 2 r_g delta_gh),        dR1_g/dy_(G+h) = E0 dn_f,g/dlambda_h / m_g,
    ///   dR2s_g/dy_h = r_h (dOmega'_g/dr_h / m_g + 2 lambda_g delta_gh)/(r_g E0) - delta_gh R2s_g,
    ///   dR2s_g/dy_(G+h) = (dOmega'_g/dlambda_h / m_g + 2 r_g delta_gh)/r_g.
    /// Null when the sum keeps no eigenvectors, or at T = 0 when a state sits at mu (occupations jump there).
    /// </summary>
    internal double[]? AnalyticJacobian(double[] y, double[] res, BandFilling fill)
    {
        if (_sum is not ISaddlePointDerivatives d) return null;
        double t = _settings.Temperature;
        if (t <= 0 && (fill.Status != FermiLevelStatus.Regular || _lastTable is not { } table || StateAtMu(table, fill.Mu))) return null;
        int n = 2 * G;
        var raw = new double[n * n];
        if (!d.TryDerivatives(fill.Mu, t, raw)) return null;
        var j = new double[n * n];
        for (int g = 0; g < G; g++)
        {
            double rg = Math.Exp(y[g]), lg = y[G + g] * _energyScale, m = _groups[g].Shells;
            for (int h = 0; h < G; h++)
            {
                double rh = Math.Exp(y[h]), delta = g == h ? 1 : 0;
                j[g * n + h] = rh * (raw[g * n + h] / m + 2 * rg * delta);
                j[g * n + G + h] = _energyScale * raw[g * n + G + h] / m;
                j[(G + g) * n + h] = rh * (raw[(G + g) * n + h] / m + 2 * lg * delta) / (rg * _energyScale) - delta * res[G + g];
                j[(G + g) * n + G + h] = (raw[(G + g) * n + G + h] / m + 2 * rg * delta) / rg;
            }
        }
        return j;
    }

    /// <summary>True when a state lies at mu to 1e-12 of the spectrum's width (a T = 0 occupation step on it).</summary>
    private static bool StateAtMu(StateTable table, double mu)
    {
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity, closest = double.PositiveInfinity;
        foreach (var e in table.Energy) { lo = Math.Min(lo, e); hi = Math.Max(hi, e); closest = Math.Min(closest, Math.Abs(e - mu)); }
        return closest <= 1e-12 * Math.Max(hi - lo, 1e-300);
    }

    private StateTable? _lastTable;

    /// <summary>
    /// For checks: the analytic Jacobian of the scaled residuals at x = (r, lambda) (at finite U x = (e, d, lambda)) and a
    /// finite-difference one in y = (ln r, lambda/E0) (at finite U y = (ln(e + d), d/(e + d), lambda/E0)): central differences with steps h and h/2 combined by Richardson extrapolation (error O(h^4)),
    /// both row-major (2G or 3G squared). Null analytic when unavailable.
    /// </summary>
    internal (double[]? Analytic, double[] Numeric) JacobianCheck(double[] x, double step = 1e-5)
    {
        var y = ToIterationVector(x);
        var (res, fill) = EvaluateLog(y);
        var analytic = _u is null ? AnalyticJacobian(y, res, fill) : AnalyticJacobianFinite(y, res, fill);
        int n = y.Length;
        var numeric = new double[n * n];
        for (int c = 0; c < n; c++)
        {
            var d1 = Central(y, c, step); var d2 = Central(y, c, step / 2);
            for (int r = 0; r < n; r++) numeric[r * n + c] = (4 * d2[r] - d1[r]) / 3;
        }
        return (analytic, numeric);
    }

    private double[] Central(double[] y, int c, double h)
    {
        var yp = (double[])y.Clone(); yp[c] += h;
        var ym = (double[])y.Clone(); ym[c] -= h;
        var (rp, _) = EvaluateLog(yp);
        var (rm, _) = EvaluateLog(ym);
        var d = new double[y.Length];
        for (int r = 0; r < y.Length; r++) d[r] = (rp[r] - rm[r]) / (2 * h);
        return d;
    }

    public SaddlePoint Solve(CancellationToken cancellation = default)
    {
        var clock = Stopwatch.StartNew();
        _passes = 0;
        var seed = CoarseSeed(cancellation);
        Attempt? best = null;
        foreach (var start in Starts(seed?.Start))
        {
            var attempt = Iterate(start, cancellation, seed is { } s && start == s.Start ? s.Jacobian : null);
            if (best is null || (attempt.Converged && !best.Converged) || (!best.Converged && attempt.Residual < best.Residual)) best = attempt;
            // A start that flows to r = 0 speaks for all: smaller starting amplitudes only flow there faster.
            if (attempt.Converged || attempt.Collapsed) break;
        }
        // Kept before Finish, whose decoupled branch refills the sum with energies only.
        // (The attempt's vector is (r, lambda) at infinite U and the boson vector at finite U.)
        var lastAmplitudes = _u is null ? MeanFieldAmplitudes.Unpack(best!.X) : FiniteAmplitudes(ToIterationVector(best!.X));
        var last = lastAmplitudes is null ? null : (_sum as MeshStateSum)?.LastPass(lastAmplitudes);
        var result = Finish(best!);
        return result with { WallSeconds = clock.Elapsed.TotalSeconds, ZonePasses = _passes, Symmetry = _reduction,
                             FinalPass = last is not null && last.MadeAt(result.Amplitudes) ? last : null };
    }

    private sealed record Attempt(double[] X, double[] Res, BandFilling Filling, int Iterations, bool Converged, bool Collapsed, bool Stalled)
    {
        public double Residual => MaxAbs(Res);
    }

    private double[]? _lastJacobian;

    private Attempt Iterate(double[] x0, CancellationToken ct, double[]? jacobian = null)
    {
        var y = ToIterationVector(x0);
        var (res, fill) = EvaluateLog(y);
        double[]? jac = jacobian is null ? null : (double[])jacobian.Clone(); bool fresh = false;
        bool newton = _settings.AnalyticJacobian && _sum is ISaddlePointDerivatives;
        int n = y.Length;
        double collapse = Math.Log(_settings.CollapseThreshold);
        var history = new List<double>();
        for (int it = 0; it < _settings.MaxIterations; it++)
        {
            ct.ThrowIfCancellationRequested();
            if (MaxAbs(Judged(y, res)) < _settings.Tolerance && MaxAbs(res) < 1e3 * _settings.Tolerance)
            {
                _lastJacobian = jac;
                return new(ToAmplitudeVector(y), Reported(y, res), fill, it, true, false, false);
            }
            // Collapse: r below the threshold, or r small and the residual no longer falling (no r > 0 solution:
            // the scaled equations tend to constants as r -> 0, so the iteration creeps towards 0 on a plateau).
            bool collapsed = true, small = true;
            for (int g = 0; g < G; g++) { collapsed &= y[g] < collapse; small &= Math.Exp(2 * y[g]) < 1e-3 * _groups[g].Q; }
            history.Add(Norm(res));
            if (small && history.Count > 4 && history[^1] > 0.7 * history[^5]) collapsed = true;
            if (_u is not null) collapsed = FiniteCollapsing(y, history);
            if (collapsed) return new(ToAmplitudeVector(y), Reported(y, res), fill, it, false, true, false);
            bool newtonStep = false;
            if (newton)
            {
                if ((_u is null ? AnalyticJacobian(y, res, fill) : AnalyticJacobianFinite(y, res, fill)) is { } analytic) { jac = analytic; fresh = true; newtonStep = true; }
                else newton = false;
            }
            if (jac is null) { jac = Jacobian(y, res); fresh = true; }
            var rhs = new double[n];
            for (int i = 0; i < n; i++) rhs[i] = -res[i];
            if (!Numerics.DenseSolve.TrySolve(jac, rhs, n, out var dy))
            {
                if (newtonStep) { newton = false; jac = null; continue; }
                if (fresh) return new(ToAmplitudeVector(y), Reported(y, res), fill, it, false, false, true);
                jac = null; continue;
            }
            // A step may change r by at most a factor e^2 (ln r moves by at most 2).
            double alpha = 1;
            for (int g = 0; g < G; g++) if (Math.Abs(dy[g]) > 2) alpha = Math.Min(alpha, 2 / Math.Abs(dy[g]));
            // At finite U the share t = d/(e + d) moves by at most 0.2 per step.
            if (_u is not null) for (int g = G; g < 2 * G; g++) if (Math.Abs(dy[g]) > 0.2) alpha = Math.Min(alpha, 0.2 / Math.Abs(dy[g]));
            double norm0 = Norm(res);
            bool accepted = false;
            double[] yn = y, rn = res; BandFilling fn = fill;
            for (int ls = 0; ls < 8; ls++, alpha *= 0.5)
            {
                yn = new double[n];
                for (int i = 0; i < n; i++) yn[i] = y[i] + alpha * dy[i];
                (rn, fn) = EvaluateLog(yn);
                if (Norm(rn) < (1 - 1e-4 * alpha) * norm0) { accepted = true; break; }
            }
            if (!accepted)
            {
                // Newton failed here: Broyden with a finite-difference Jacobian takes over for this start.
                if (newtonStep) { newton = false; jac = null; NewtonFallbacks++; continue; }
                if (fresh) return new(ToAmplitudeVector(y), Reported(y, res), fill, it + 1, false, false, true);
                jac = null; continue;
            }
            if (newtonStep) { y = yn; res = rn; fill = fn; continue; }
            // Broyden's rank-one update: J += (dF - J dy) dy^T / (dy^T dy).
            var step = new double[n]; double ss = 0;
            for (int i = 0; i < n; i++) { step[i] = yn[i] - y[i]; ss += step[i] * step[i]; }
            for (int r = 0; r < n; r++)
            {
                double jdy = 0;
                for (int c = 0; c < n; c++) jdy += jac[r * n + c] * step[c];
                double u = (rn[r] - res[r] - jdy) / ss;
                for (int c = 0; c < n; c++) jac[r * n + c] += u * step[c];
            }
            fresh = false;
            // Broyden keeps its Jacobian only while it pays: a step that did not halve the residual rebuilds it.
            if (Norm(rn) > 0.5 * norm0 && Norm(rn) > 1e3 * _settings.Tolerance) jac = null;
            y = yn; res = rn; fill = fn;
        }
        var final = Reported(y, res);
        return new(ToAmplitudeVector(y), final, fill, _settings.MaxIterations, MaxAbs(Judged(y, res)) < _settings.Tolerance, false, false);
    }

    private SaddlePoint Finish(Attempt a)
    {
        if (_u is not null) return FinishFinite(a);
        var amp = MeanFieldAmplitudes.Unpack(a.X);
        var notes = new List<string>();
        var decoupled = Decoupled();
        if (a.Collapsed)
        {
            if (decoupled is not null)
            {
                notes.Add("r collapsed to 0: the decoupled (local-moment) solution is the only one at this temperature (above the mean-field Kondo temperature, a sharp transition only at mean field; physically a crossover).");
                return decoupled with { Iterations = a.Iterations, Notes = notes };
            }
            notes.Add("r collapsed to 0 but no decoupled solution exists at this electron count.");
        }
        var kondo = Build(amp, a.Filling, a.Res, a.Iterations, a.Converged, SaddlePointBranch.Kondo, decoupled?.FreeEnergy);
        bool flowingToZero = true;
        for (int g = 0; g < G; g++) flowingToZero &= amp.R[g] * amp.R[g] < 1e-3 * _groups[g].Q;
        if (!a.Converged && flowingToZero && decoupled is not null)
        {
            notes.Add($"no coherent solution: every start flowed towards r = 0 (last r^2 = {amp.R[0] * amp.R[0]:G3}); the decoupled (local-moment) solution is reported. Near the mean-field Kondo temperature this also happens when the k-mesh cannot resolve the small Kondo scale: try a larger --mesh.");
            return decoupled with { Iterations = a.Iterations, Notes = notes };
        }
        if (!a.Converged)
        {
            notes.Add(a.Stalled
                ? $"the iteration stalled at residual {a.Residual:G3} (no step lowered it)."
                : $"the iteration cap of {_settings.MaxIterations} was reached at residual {a.Residual:G3}.");
            if (_tetra is not null && a.Filling.Status != FermiLevelStatus.Regular)
                notes.Add("T = 0: the interpolated bands cannot hold the electron count at any single mu (a dispersionless band at the Fermi level). Use a small temperature (for example --temperature 1K).");
            else if (_settings.Temperature <= 0 && a.Filling.Status != FermiLevelStatus.Regular)
                notes.Add("T = 0 with states at the Fermi level on this mesh: occupations jump between iterations. " +
                          "Use a small temperature (for example --temperature 1K) or a shifted mesh with an odd number of divisions.");
            else
                notes.Add("try more iterations (--max-iterations, or [solver] max_iterations), a looser --tolerance, a starting point from a neighbouring solution, or a small temperature.");
        }
        else if (decoupled is not null && decoupled.FreeEnergy < kondo.FreeEnergy)
        {
            notes.Add($"the decoupled solution has the lower free energy ({decoupled.FreeEnergy:G8} < {kondo.FreeEnergy:G8}): it is reported instead.");
            return decoupled with { Notes = notes, Iterations = a.Iterations };
        }
        return kondo with { Notes = notes };
    }

    private SaddlePoint Build(MeanFieldAmplitudes amp, BandFilling fill, double[] res, int iterations, bool converged,
                              SaddlePointBranch branch, double? decoupledF)
    {
        var groups = new ShellGroupSolution[G];
        for (int g = 0; g < G; g++)
            groups[g] = new(_groups[g].Name, _groups[g].Shells, amp.R[g], amp.Lambda[g], _groups[g].Level,
                            _groups[g].Level + amp.Lambda[g] - fill.Mu, fill.FOccupation[g] / _groups[g].Shells);
        return new SaddlePoint
        {
            Converged = converged, Iterations = iterations, ResidualNorm = MaxAbs(res), Temperature = _settings.Temperature,
            Mu = fill.Mu, FreeEnergy = FreeEnergy(amp, fill), ElectronsPerCell = _model.ElectronsPerCell, Branch = branch,
            Groups = groups, Amplitudes = amp, DecoupledFreeEnergy = decoupledF, FermiLevel = fill.Status,
            FermiWindow = fill.Window, Sampling = SamplingText(),
        };
    }

    private string SamplingText() => _settings.Temperature > 0
        ? $"{_sum.Description}; Fermi-Dirac occupations at T = {_settings.Temperature:G6}"
        : _tetra is null ? $"{_sum.Description}; T = 0 step occupations"
        : _tetra.BloechlCorrection ? $"{_sum.Description}; T = 0 linear-tetrahedron weights with Bloechl corrections"
        : $"{_sum.Description}; T = 0 linear-triangle weights";
}
