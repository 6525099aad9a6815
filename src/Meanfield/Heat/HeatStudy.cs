using System.Diagnostics;
using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Nodes;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Solver;
using Meanfield.Units;

namespace Meanfield.Heat;

/// <summary>What a heat study computes: the temperature table, fits, measured data and the optional full mean field.</summary>
public sealed record HeatStudyRequest
{
    /// <summary>Lowest temperature of the table (K, positive).</summary>
    public required double MinTemperatureK { get; init; }
    /// <summary>Highest temperature of the table (K, above the lowest).</summary>
    public required double MaxTemperatureK { get; init; }
    /// <summary>Temperatures in the table (at least 3; default 60).</summary>
    public int Points { get; init; } = 60;
    /// <summary>Logarithmic spacing of the table (default linear).</summary>
    public bool Logarithmic { get; init; }
    /// <summary>Fit window (K); null chooses it (<see cref="LowTemperatureExpansion.SelectWindow"/>).</summary>
    public (double Lo, double Hi)? FitWindowK { get; init; }
    /// <summary>Measured heat capacity (.csv, <see cref="MeasuredHeatCsv"/>), or null.</summary>
    public string? MeasuredPath { get; init; }
    /// <summary>Debye temperature (K) of a phonon term subtracted from the measured data, with <see cref="AtomsPerFormulaUnit"/>.</summary>
    public double? DebyeTemperatureK { get; init; }
    /// <summary>Atoms per formula unit of the Debye term.</summary>
    public double? AtomsPerFormulaUnit { get; init; }
    /// <summary>Measured C of a non-magnetic reference compound subtracted from the data (.csv), or null.</summary>
    public string? ReferencePath { get; init; }
    /// <summary>Also C = -T d^2F/dT^2 with the saddle point re-solved at each temperature (needs <see cref="Settings"/>).</summary>
    public bool FullMeanField { get; init; }
    /// <summary>Temperatures of the full mean-field sweep (at least 5; default 41).</summary>
    public int MeanFieldPoints { get; init; } = 41;
    /// <summary>Base mesh of the DOS (default: the solver mesh rounded up to even, at least 24).</summary>
    public int? DosMesh { get; init; }
    /// <summary>Solver settings of the saddle point (its mesh sets the default DOS mesh; the full mean field re-solves with them).</summary>
    public SolverSettings? Settings { get; init; }

    /// <summary>Checks the request; the options named are those of `meanfield heat`, which fills these fields one to one.</summary>
    /// <exception cref="RequestError">The first inconsistent field, named with its value.</exception>
    /// <exception cref="ArgumentException">The full mean field is asked for without <see cref="Settings"/>.</exception>
    public void Validate()
    {
        if (!(MinTemperatureK > 0) || !double.IsFinite(MaxTemperatureK) || !(MaxTemperatureK > MinTemperatureK))
            throw new RequestError($"--tmin {MinTemperatureK:G6} K, --tmax {MaxTemperatureK:G6} K: need 0 < lowest < highest");
        if (Points < 3) throw new RequestError($"--points {Points}: need at least 3 temperatures");
        if (FullMeanField && MeanFieldPoints < 5) throw new RequestError($"--mf-points {MeanFieldPoints}: need at least 5 mean-field temperatures");
        if (FullMeanField && Settings is null) throw new ArgumentException("the full mean field needs the solver settings (HeatStudyRequest.Settings)");
        if (DosMesh is { } m && m < 4) throw new RequestError($"--dos-mesh {m}: need at least 4");
        if ((DebyeTemperatureK is null) != (AtomsPerFormulaUnit is null)) throw new RequestError("--debye and --atoms: a Debye term needs both its temperature and the atoms per formula unit");
        if (DebyeTemperatureK is { } th && (!(th > 0) || !(AtomsPerFormulaUnit > 0))) throw new RequestError($"--debye {th:G6} K, --atoms {AtomsPerFormulaUnit}: both must be positive");
        if (DebyeTemperatureK is not null && ReferencePath is not null) throw new RequestError("--debye and --reference: subtract either a Debye term or a reference compound, not both");
        if ((DebyeTemperatureK is not null || ReferencePath is not null) && MeasuredPath is null) throw new RequestError($"{(DebyeTemperatureK is not null ? "--debye" : "--reference")}: phonon subtraction acts on measured data, and none is given (--measured)");
        if (FitWindowK is { } w && !(w.Hi > w.Lo && w.Lo >= 0)) throw new RequestError($"--fit-window {w.Lo:G6} K {w.Hi:G6} K: need 0 <= T1 < T2");
    }
}

/// <summary>Wall-clock seconds of the parts of a heat study.</summary>
/// <param name="NodeSearch">Node search.</param>
/// <param name="Dos">Mesh refinement and DOS tabulation.</param>
/// <param name="Heat">C(T) and S(T) at every temperature.</param>
/// <param name="FullMeanField">Fits, comparison and the full mean-field sweep.</param>
public sealed record HeatTimings(double NodeSearch, double Dos, double Heat, double FullMeanField);

/// <summary>Everything a heat study found; read by the report, the table writer and the plots.</summary>
/// <param name="Model">The model.</param>
/// <param name="Request">What was asked.</param>
/// <param name="Dos">The quasiparticle DOS integrated for the heat.</param>
/// <param name="DosMethod">How the DOS was computed, in words.</param>
/// <param name="KPoints">k-points diagonalised for the DOS.</param>
/// <param name="FermiLevel">T = 0 Fermi level of the DOS (energy unit): the reference of mu(T) and the node offsets.</param>
/// <param name="SolutionMu">mu of the saddle point, when known (energy unit).</param>
/// <param name="Table">Thermodynamics at the requested temperatures.</param>
/// <param name="Curve">C at the requested temperatures and on a logarithmic grid, merged (what the fits and plots use).</param>
/// <param name="Expansion">Fit of C/T = gamma + beta T^2 + delta T^4.</param>
/// <param name="Sommerfeld">Two-term fit C/T = gamma + beta T^2 over the same window.</param>
/// <param name="PowerLaw">Free power law over the window, or null when C is not positive there.</param>
/// <param name="DepartureK">Lowest temperature from which C/T leaves gamma + beta T^2 by more than 5 %, or null.</param>
/// <param name="Search">Node search (3D lattices at integer filling), or null.</param>
/// <param name="Nodes">The nodes sorted against the Fermi level, or null without a search.</param>
/// <param name="VelocityFromBeta">Isotropic untilted cone velocity that gives the fitted beta, or null.</param>
/// <param name="Agreement">Range (K) where the numerical C and the analytic node term agree within <see cref="HeatStudy.AgreementTolerance"/>.</param>
/// <param name="Measured">Measured data after phonon subtraction, or null.</param>
/// <param name="Comparison">Fits of prediction and measurement over one window, or null.</param>
/// <param name="Sweep">Full mean-field sweep, or null.</param>
/// <param name="Notes">Plain-language warnings: unresolved mesh, nodes off E_F, type-II nodes, no T^3 law.</param>
/// <param name="Timings">Seconds per part.</param>
public sealed record HeatStudyResult(
    BoundModel Model, HeatStudyRequest Request, TabulatedDos Dos, string DosMethod, int KPoints, double FermiLevel,
    double? SolutionMu, IReadOnlyList<ThermalPoint> Table, HeatCurve Curve, LowTemperatureExpansion Expansion,
    SommerfeldFit Sommerfeld, PowerLawFit? PowerLaw, double? DepartureK, NodeSearchResult? Search,
    FermiLevelNodes? Nodes, NodeVelocity? VelocityFromBeta, (double MinK, double MaxK)? Agreement,
    MeasuredHeat? Measured, HeatComparison? Comparison, MeanFieldHeatSweep? Sweep, IReadOnlyList<string> Notes,
    HeatTimings Timings)
{
    /// <summary>Fitted beta over the analytic node beta, or null without pinned nodes.</summary>
    public double? BetaRatio => Nodes is { MolarBeta: > 0 } n ? Expansion.Beta / n.MolarBeta : null;

    /// <summary>C/T^3 at the lowest temperature over the analytic node beta, or null without pinned nodes.</summary>
    public double? LowestRatio => Nodes is { MolarBeta: > 0 } n
        ? Curve.MolarHeat[0] / Math.Pow(Curve.TemperaturesK[0], 3) / n.MolarBeta : null;

    /// <summary>Full mean-field C, or null.</summary>
    public HeatCurve? FullCurve => Sweep?.Curve();
}

/// <summary>
/// The heat study behind `meanfield heat`: the quasiparticle DOS of a solved model (an adaptive tetrahedron mesh in 3D,
/// refined until the cones at the Fermi level are resolved down to k_B T_min), C(T) and S(T) at fixed electron count,
/// the low-temperature expansion and power law, the tilt-aware analytic node term and the velocity it implies, measured
/// data with phonons subtracted, and the optional full mean-field C.
/// </summary>
public static class HeatStudy
{
    /// <summary>Refinement tolerance of the adaptive DOS: interpolation error over distance from E_F (see
    /// <see cref="AdaptiveMeshOptions.RelativeTolerance"/>); 0.03 reproduces the beta of tilted cones to about 1.5 % (0.05: 2 %, 0.02: 1 %, on the test lattice).</summary>
    public const double RefinementTolerance = 0.03;

    /// <summary>
    /// Relative accuracy of C(T) from the adaptive mesh, attached to the curve as its one-sigma uncertainty so that the
    /// fitted gamma and beta carry the accuracy of the numerics: the error of C/T^3 measured on the tilted test lattice
    /// is about 0.45 x <see cref="RefinementTolerance"/> (systematic: linear interpolation raises convex cone energies).
    /// </summary>
    public const double MeshRelativeAccuracy = 0.5 * RefinementTolerance;

    /// <summary>Refinement reaches energies up to this many k_B T_max from E_F: the heat kernels there weigh
    /// below 30^4 e^-30 ~ 1e-7 of their peak.</summary>
    public const double RefinementWindowPerT = 30;

    /// <summary>Temperatures of the logarithmic grid added to the table for the fits.</summary>
    public const int LawPoints = 48;

    /// <summary>Deviation (percent) at which C is said to leave its low-temperature law.</summary>
    public const double DeparturePercent = 5;

    /// <summary>Relative tolerance of the agreement between numerical C and the analytic node term.</summary>
    public const double AgreementTolerance = 0.02;

    /// <summary>
    /// Runs the study for <paramref name="model"/> with Bloch source <paramref name="hamiltonian"/> (renormalized, or
    /// bare without a correlated shell) and the saddle point's <paramref name="solutionMu"/> when known.
    /// </summary>
    /// <exception cref="RequestError">A lattice without momentum, an inconsistent request, a fit window with too few
    /// points, or the full mean field of a model without a correlated shell.</exception>
    /// <exception cref="HeatDataError">Bad measured or reference data (file, line, column).</exception>
    /// <exception cref="InvalidOperationException">The full mean-field sweep did not converge.</exception>
    public static HeatStudyResult Run(BoundModel model, IBlochSource hamiltonian, double? solutionMu, HeatStudyRequest request)
    {
        request.Validate();
        if (model.IsMomentumFree || model.Lattice.Dimension < 2)
            throw new RequestError($"{model.SourcePath}: heat needs the quasiparticle DOS of a lattice with momentum (2D or 3D)");
        var measured = LoadMeasured(request);
        var notes = new List<string>();
        double k = model.Unit.Kelvins(), tMin = request.MinTemperatureK, tMax = request.MaxTemperatureK;
        int baseMesh = request.DosMesh ?? Math.Max(24, (request.Settings?.Mesh ?? 16) + (request.Settings?.Mesh ?? 16) % 2);
        var clock = Stopwatch.StartNew();

        var search = Search(model, hamiltonian, solutionMu);
        double tSearch = Lap(clock);
        var (dos, method, kPoints, adaptive) = Tabulate(model, hamiltonian, search, solutionMu, baseMesh, tMin, tMax, notes);
        double tMesh = Lap(clock);
        double fermi = dos.GroundStateFermiLevel();

        var heat = new QuasiparticleHeat(dos);
        var table = Temperatures(request).Select(heat.At).ToArray();
        var curve = Merge(table, LogGrid(tMin, tMax, LawPoints).Select(heat.At));
        if (adaptive)
        {
            double floor = 1e-12 * curve.MolarHeat.Max();
            curve = curve.WithSigma(curve.MolarHeat.Select(c => MeshRelativeAccuracy * Math.Max(c, floor)).ToArray());
        }
        double tHeat = Lap(clock);

        var expansion = request.FitWindowK is { } w
            ? LowTemperatureExpansion.Fit(curve, w.Lo, w.Hi)
            : LowTemperatureExpansion.SelectWindow(curve);
        var sommerfeld = SommerfeldFit.Fit(curve, expansion.WindowMinK, expansion.WindowMaxK);
        PowerLawFit? power = null;
        try { power = PowerLawFit.Fit(curve, expansion.WindowMinK, expansion.WindowMaxK); }
        catch (RequestError e) when (e.Message.Contains("C > 0")) { notes.Add($"no power-law fit: {e.Message}"); }
        double? departure = expansion.DepartureTemperature(curve, DeparturePercent);

        FermiLevelNodes? nodes = null;
        NodeVelocity? velocity = null;
        (double, double)? agreement = null;
        if (search is not null)
        {
            nodes = FermiLevelNodes.From(search, model, fermi, FermiLevelNodes.PinningFraction * tMin / k);
            DescribeNodes(nodes, search, model, tMin, notes);
            if (nodes.Cones > 0 && expansion.Beta > 0)
                velocity = new NodeHeat(model.Unit, model.Lattice.CellVolume, model.FormulaUnitsPerCell)
                    .VelocityFromBeta(expansion.Beta, expansion.BetaError, nodes.Cones);
            if (nodes.Cones > 0) agreement = AgreementWindow.Find(curve, nodes.MolarHeat, AgreementTolerance);
        }
        if (solutionMu is { } mu && Math.Abs(mu - fermi) > tMin / k)
            notes.Add($"the saddle point's mu ({mu:G10} {model.Unit.Symbol()}) lies {mu - fermi:G3} {model.Unit.Symbol()} "
                      + $"({(mu - fermi) * k:G3} K) from the T -> 0 Fermi level of the heat's DOS (finite T and a different mesh in the solve); "
                      + "the heat uses the DOS's own mu(T) at fixed electron count");

        HeatComparison? comparison = measured is null ? null
            : HeatComparison.Compare(curve, measured.Curve, expansion.WindowMinK, expansion.WindowMaxK);
        MeanFieldHeatSweep? sweep = request.FullMeanField ? Sweep(model, request) : null;
        double tFull = Lap(clock);
        return new HeatStudyResult(model, request, dos, method, kPoints, fermi, solutionMu, table, curve, expansion,
            sommerfeld, power, departure, search, nodes, velocity, agreement, measured, comparison, sweep, notes,
            new HeatTimings(tSearch, tMesh, tHeat, tFull));
    }

    private static double Lap(Stopwatch clock)
    {
        double s = clock.Elapsed.TotalSeconds;
        clock.Restart();
        return s;
    }

    private static MeasuredHeat? LoadMeasured(HeatStudyRequest r)
    {
        if (r.MeasuredPath is null) return null;
        var data = MeasuredHeatCsv.Load(r.MeasuredPath);
        if (r.DebyeTemperatureK is { } theta) data = PhononSubtraction.Debye(data, theta, r.AtomsPerFormulaUnit!.Value);
        if (r.ReferencePath is { } path) data = PhononSubtraction.Reference(data, MeasuredHeatCsv.Load(path));
        return data;
    }

    // The touchings of bands n_occ - 1 and n_occ, on 3D lattices at integer filling.
    private static NodeSearchResult? Search(BoundModel model, IBlochSource h, double? mu)
    {
        double n = model.ElectronsPerCell;
        int occupied = (int)Math.Round(n);
        if (model.Lattice.Dimension != 3 || Math.Abs(n - occupied) > 1e-9 || occupied < 1 || occupied >= h.Size) return null;
        return NodeSearch.Find(h, occupied, mu ?? 0);
    }

    // With cones between bands n_occ - 1 and n_occ (3D): the adaptive tetrahedron mesh centred on the node energy,
    // re-centred on the exact Fermi level. Otherwise (metals, insulators, 2D) the DOS is smooth on the scale of the mesh
    // or gapped: the uniform tetrahedron (triangle) mesh with nested grids around E_F, as the cones need and a Fermi
    // surface does not (refining a Fermi surface down to k_B T_min would cost millions of k-points for nothing).
    private static (TabulatedDos Dos, string Method, int KPoints, bool Adaptive) Tabulate(
        BoundModel model, IBlochSource h, NodeSearchResult? search, double? mu, int baseMesh, double tMin, double tMax,
        List<string> notes)
    {
        double k = model.Unit.Kelvins();
        var typeI = search?.Nodes.Where(n => n.Type == NodeType.TypeI && n.DetVelocity > 0).ToList();
        if (model.Lattice.Dimension != 3 || typeI is not { Count: > 0 })
        {
            var uniform = new TetrahedronDos(h, new KMesh(model.Lattice, baseMesh));
            string kind = model.Lattice.Dimension == 3 ? "linear tetrahedron method" : "linear triangle method";
            return (DosTabulation.ForHeat(uniform, model, tMin, tMax),
                    $"{kind} on a Gamma-centred {baseMesh}-division mesh (no cone to resolve)", uniform.Spectrum.Mesh.Count, false);
        }
        double reference = Median(typeI.Select(n => search!.ChemicalPotential + n.EnergyOffset));
        var engine = new AdaptiveTetrahedronDos(h, new AdaptiveMeshOptions
        {
            BaseMesh = baseMesh, ReferenceEnergy = reference, Window = RefinementWindowPerT * tMax / k,
            Floor = tMin / k, RelativeTolerance = RefinementTolerance,
        });
        var (fermi, _) = engine.FermiLevel(model.ElectronsPerCell);
        if (Math.Abs(fermi - reference) > tMin / k) engine.Recentre(fermi);
        if (engine.BudgetExhausted)
            notes.Add($"the DOS mesh hit its budget of {engine.Options.MaxCells} cells: its worst cell misses the interpolation "
                      + $"tolerance {engine.WorstRemainingRatio:G3} times; C at the lowest temperatures is not resolved");
        return (DosTabulation.ForHeat(engine, model, tMin, tMax), engine.Describe(), engine.KPoints, true);
    }

    private static double Median(IEnumerable<double> values)
    {
        var v = values.OrderBy(x => x).ToArray();
        return 0.5 * (v[(v.Length - 1) / 2] + v[v.Length / 2]);
    }

    private static void DescribeNodes(FermiLevelNodes nodes, NodeSearchResult search, BoundModel model, double tMin,
                                      List<string> notes)
    {
        double k = model.Unit.Kelvins();
        string u = model.Unit.Symbol();
        if (nodes.OffFermiLevel.Count > 0)
        {
            double far = nodes.OffFermiLevel.Max(n => Math.Abs(FermiLevelNodes.Offset(search, n, nodes.FermiLevel)));
            notes.Add($"{nodes.OffFermiLevel.Count} type-I node(s) lie off the T = 0 Fermi level by up to {far:G3} {u} "
                      + $"({far * k:G3} K, more than {FermiLevelNodes.PinningFraction} k_B T_min): they hold Fermi pockets, "
                      + $"so C ~ gamma T below about {far * k:G3} K and no T^3 law from them; they are left out of the node term");
        }
        if (nodes.TypeII.Count > 0)
            notes.Add($"{nodes.TypeII.Count} type-II node(s) (tilt ratio above 1): a Fermi surface at the node energy, "
                      + "no T^3 law; left out of the node term");
        if (search.FermiSurfaceAwayFromNodes && nodes.Cones == 0 && search.Nodes.Count == 0)
            notes.Add("the spectrum is metallic at mu: C ~ gamma T, no node term");
    }

    private static MeanFieldHeatSweep Sweep(BoundModel model, HeatStudyRequest r)
    {
        if (model.Shells.Count == 0) throw new RequestError($"--full-mean-field: {model.SourcePath}: no correlated shell, so there is no mean field to re-solve");
        var settings = r.Settings!;
        var grid = MeanFieldHeat.Grid(r.MinTemperatureK, r.MaxTemperatureK, r.MeanFieldPoints);
        return MeanFieldHeat.Sweep((t, g) => new SaddlePointSolver(model, settings with { Temperature = t, InitialGuess = g }).Solve(),
                                   model.Unit, model.FormulaUnitsPerCell, grid,
                                   decoupled: t => new SaddlePointSolver(model, settings with { Temperature = t }).Decoupled());
    }

    /// <summary>The table's temperatures (K): linear or logarithmic from the lowest to the highest, ends exact.</summary>
    public static double[] Temperatures(HeatStudyRequest r) => Enumerable.Range(0, r.Points).Select(i =>
    {
        double s = i / (r.Points - 1.0);
        double t = r.Logarithmic ? r.MinTemperatureK * Math.Pow(r.MaxTemperatureK / r.MinTemperatureK, s)
                                 : r.MinTemperatureK + s * (r.MaxTemperatureK - r.MinTemperatureK);
        return i == r.Points - 1 ? r.MaxTemperatureK : t;
    }).ToArray();

    private static double[] LogGrid(double lo, double hi, int n) =>
        Enumerable.Range(0, n).Select(i => i == n - 1 ? hi : lo * Math.Pow(hi / lo, i / (n - 1.0))).ToArray();

    // Table and fit temperatures in one ascending curve (points closer than 1e-9 relative are one).
    private static HeatCurve Merge(IEnumerable<ThermalPoint> a, IEnumerable<ThermalPoint> b)
    {
        var all = a.Concat(b).OrderBy(p => p.TemperatureK).ToList();
        var kept = new List<ThermalPoint>();
        foreach (var p in all)
            if (kept.Count == 0 || p.TemperatureK > kept[^1].TemperatureK * (1 + 1e-9)) kept.Add(p);
        return new HeatCurve(kept.Select(p => p.TemperatureK).ToArray(), kept.Select(p => p.MolarHeatCapacity).ToArray());
    }
}
