using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Models;

/// <summary>
/// Binds a <see cref="ModelSpec"/> to numbers: evaluates the parameters (with command-line overrides), builds the
/// lattice, sites, orbitals and shells, generates every term, and checks the result (names, electron count,
/// Hermiticity). Every problem is a <see cref="ModelError"/>.
/// </summary>
public static class ModelBinder
{
    /// <summary>Where override errors point: the command line.</summary>
    public const string OverrideSource = "--set";

    /// <param name="overrides">NAME=VALUE pairs from "--set"; VALUE is an expression of the parameters before NAME.</param>
    public static BoundModel Bind(ModelSpec spec, IReadOnlyDictionary<string, string>? overrides = null)
    {
        var (env, parameters) = BindParameters(spec, overrides);
        var header = spec.Header;
        int flavours = header.Flavours;
        var lattice = BindLattice(spec.Lattice, env);
        double halfWidth = 0;
        if (spec.Lattice.HalfWidth is { } hw)
        {
            halfWidth = hw.EvaluateReal(env);
            if (!(halfWidth > 0)) throw new ModelError(hw.Location, hw.Field, $"half_width must be positive, found {halfWidth:G6}");
            PhysicalRange.CheckEnergy(halfWidth, header.Unit, hw.Location, hw.Field, "half_width");
        }
        var layout = UnitCellLayout.Build(spec, lattice, env);
        var terms = new TermBuilder(spec, lattice, layout, env);
        terms.AddAll();
        // The finite-U four-boson mean field is paramagnetic (equal p for both spins, which time reversal guarantees).
        if (spec.Zeeman is { } zeeman && layout.Shells.FirstOrDefault(x => x.HasFiniteU) is { } finiteShell)
            throw new ModelError(zeeman.Location, "zeeman",
                $"a Zeeman field with a finite-U shell (U = {finiteShell.U:G6}) is not solved: the four-boson mean field here is paramagnetic; remove [zeeman] or omit U");

        double formula = header.FormulaUnitsPerCell.EvaluateReal(env);
        if (!(formula > 0))
            throw new ModelError(header.FormulaUnitsPerCell.Location, header.FormulaUnitsPerCell.Field, $"must be positive, found {formula:G6}");
        if (formula > PhysicalRange.MaxFormulaUnitsPerCell)
            throw new ModelError(header.FormulaUnitsPerCell.Location, header.FormulaUnitsPerCell.Field, $"{formula:G6} formula units per cell is outside the physical range (at most {PhysicalRange.MaxFormulaUnitsPerCell:G3})");
        var ne = header.ElectronsPerCell;
        double electrons = ne.EvaluateReal(env);
        int states = layout.Orbitals.Count * flavours;
        if (!(electrons >= 0 && electrons <= states))
            throw new ModelError(ne.Location, ne.Field,
                $"{electrons:G6} electrons per cell is outside [0, {states}] (states per cell = orbitals x flavours)");
        CheckInfiniteUFilling(ne, electrons, layout, flavours);
        var model = new BoundModel
        {
            Name = header.Name, Lattice = lattice, Flavours = flavours, Sites = layout.Sites, Orbitals = layout.Orbitals,
            Shells = layout.Shells, Hoppings = terms.Hoppings, Onsite = terms.Onsite, ElectronsPerCell = electrons,
            Unit = header.Unit, FormulaUnitsPerCell = formula, DosHalfWidth = halfWidth, Parameters = parameters,
            SourceText = spec.SourceText, SourcePath = spec.SourceName, Solver = spec.Solver,
        };
        CheckHermitian(spec, model);
        CheckSymmetry(model);
        return model;
    }

    /// <summary>Operations named in [solver] symmetry must be kept by the bound model (with these parameters).</summary>
    private static void CheckSymmetry(BoundModel model)
    {
        if (model.Solver?.Symmetry is not { } text || model.IsMomentumFree) return;
        var where = model.Solver.SymmetryLocation ?? new SourceLocation(model.SourcePath, null, null);
        try
        {
            var request = Symmetry.SymmetryRequest.Parse(text);
            if (request.Names is not null) Symmetry.SymmetryGroup.Find(new Bloch.BlochHamiltonian(model), request);
        }
        catch (ArgumentException e) { throw new ModelError(where, "solver.symmetry", e.Message); }
    }

    private static (Dictionary<string, Complex>, List<KeyValuePair<string, double>>) BindParameters(
        ModelSpec spec, IReadOnlyDictionary<string, string>? overrides)
    {
        var names = spec.Parameters.Select(p => p.Name).ToList();
        var replaced = new Dictionary<string, ModelExpression>();
        foreach (var (name, value) in overrides ?? new Dictionary<string, string>())
        {
            var where = new SourceLocation(OverrideSource, null, 1);
            if (!names.Contains(name))
                throw new ModelError(where, name,
                    names.Count == 0 ? $"unknown parameter '{name}': the model has no [parameters]" : $"unknown parameter '{name}'",
                    NameSuggestion.Closest(name, names));
            replaced[name] = ModelExpression.Parse(value, name, where);
        }
        var env = new Dictionary<string, Complex>();
        var list = new List<KeyValuePair<string, double>>();
        foreach (var p in spec.Parameters)
        {
            var expression = replaced.GetValueOrDefault(p.Name) ?? p.Value;
            foreach (var (used, offset) in expression.Tree.Names())
                if (!env.ContainsKey(used) && names.Contains(used))
                    throw new ModelError(expression.Location.Shift(offset), expression.Field, used == p.Name
                        ? $"'{used}' refers to itself"
                        : $"'{used}' is defined after '{p.Name}': a parameter may only use the parameters above it");
            double v = expression.EvaluateReal(env);
            env[p.Name] = v;
            list.Add(new(p.Name, v));
        }
        return (env, list);
    }

    private static Lattice BindLattice(LatticeSpec spec, IReadOnlyDictionary<string, Complex> env)
    {
        double a = 1;
        if (spec.Constant is { } c)
        {
            a = c.EvaluateReal(env);
            if (!(a > 0)) throw new ModelError(c.Location, c.Field, $"lattice constant must be positive (angstrom), found {a:G6}");
            if (a < PhysicalRange.MinLatticeConstant || a > PhysicalRange.MaxLatticeConstant)
                throw new ModelError(c.Location, c.Field,
                    $"lattice constant {a:G6} angstrom is outside the physical range {PhysicalRange.MinLatticeConstant:G3}..{PhysicalRange.MaxLatticeConstant:G3} angstrom; see \"Ranges\" in models/README.md");
        }
        if (spec.Kind != LatticeKind.Explicit) return Lattice.Create(spec.Kind, a);
        var v = spec.Vectors!;
        try { return new Lattice(LatticeKind.Explicit, a, 3, a * v[0], a * v[1], a * v[2]); }
        catch (ArgumentException)
        {
            throw new ModelError(spec.Location, "lattice.vectors", "the three Bravais vectors are linearly dependent (zero cell volume)");
        }
    }

    /// <summary>
    /// At infinite U a shell holds at most Q electrons (n_f + r^2 = Q with r^2 &gt;= 0), so a cell holds at most its
    /// conduction states plus Q per shell (Coleman, Phys. Rev. B 29, 3035 (1984): the constraint n_f + n_b = Q). A larger
    /// count has no saddle point; refusing it here keeps `check` and `solve` in agreement. A finite-U shell counts N.
    /// </summary>
    private static void CheckInfiniteUFilling(ModelExpression ne, double electrons, UnitCellLayout layout, int flavours)
    {
        if (layout.Shells.Count == 0) return;
        int conduction = layout.Orbitals.Count(o => o.Kind == OrbitalKind.Conduction) * flavours;
        // A finite-U shell holds up to N electrons (n_f is free in [0, N]); an infinite-U one at most Q.
        double shells = layout.Shells.Sum(s => s.HasFiniteU ? s.Degeneracy : s.Constraint);
        double most = conduction + shells;
        if (electrons > most * (1 + FillingTolerance))
            throw new ModelError(ne.Location, ne.Field, string.Create(System.Globalization.CultureInfo.InvariantCulture,
                $"{electrons:G6} electrons per cell cannot be placed at infinite U: the cell holds at most {most:G6} ({conduction} conduction states plus Q per correlated shell, {shells:G6} in all); lower electrons_per_cell or raise a shell's constraint"));
    }

    /// <summary>Relative slack of the filling bound, for electron counts written as rounded expressions.</summary>
    public const double FillingTolerance = 1e-12;

    private static void CheckHermitian(ModelSpec spec, BoundModel model)
    {
        double scale = 1;
        foreach (var h in model.Hoppings) scale = Math.Max(scale, h.Amplitude.MaxAbs());
        foreach (var o in model.Onsite) scale = Math.Max(scale, o.Amplitude.MaxAbs());
        foreach (var s in model.Shells) scale = Math.Max(scale, Math.Abs(s.Level));
        double defect = new BlochHamiltonian(model).HermiticityDefect();
        if (defect > 1e-9 * scale)
            throw new ModelError(new SourceLocation(spec.SourceName, null, null), "onsite",
                $"the Bloch Hamiltonian is not Hermitian (defect {defect:G3}): on-site energies and spin coefficients must give a Hermitian matrix");
    }
}
