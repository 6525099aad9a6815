using System.Numerics;
using Meanfield.Binding;
using Meanfield.Lattices;

namespace Meanfield.Models;

/// <summary>
/// Sites, orbitals and shells of the unit cell with name lookups. Orbitals are numbered site by site: the site's
/// conduction orbitals in file order, then its correlated shell.
/// </summary>
internal sealed class UnitCellLayout
{
    public required List<Site> Sites { get; init; }
    public required List<Orbital> Orbitals { get; init; }
    public required List<CorrelatedShell> Shells { get; init; }
    private readonly Dictionary<string, int> _siteIndex = [];
    private readonly Dictionary<(int, string), int> _orbitalIndex = [];

    public static UnitCellLayout Build(ModelSpec spec, Lattice lattice, IReadOnlyDictionary<string, Complex> env)
    {
        var file = spec.SourceName;
        if (spec.Sites.Count == 0)
            throw new ModelError(spec.Lattice.Location, "site", "empty model: no [[site]] blocks, so no orbitals (add [[site]] blocks after [lattice])");
        var basis = Lattice.DefaultBasis(spec.Lattice.Kind, lattice.Constant);
        var layout = new UnitCellLayout { Sites = [], Orbitals = [], Shells = [] };
        int flavours = spec.Header.Flavours;
        for (int s = 0; s < spec.Sites.Count; s++)
        {
            var site = spec.Sites[s];
            if (layout._siteIndex.ContainsKey(site.Name))
                throw new ModelError(site.Location, $"{site.Field}.name", $"site name '{site.Name}' is used twice");
            Vec3 position;
            if (site.Position is { } p) position = lattice.Constant * p;
            else if (basis is not null && s < basis.Count) position = basis[s];
            else if (lattice.Kind.IsMomentumFree()) position = Vec3.Zero;
            else throw new ModelError(site.Location, $"{site.Field}.position",
                basis is null ? "missing position [x, y, z] (units of the lattice constant)"
                              : $"missing position: the {spec.Lattice.Kind} lattice supplies only {basis.Count} default site positions");
            layout._siteIndex[site.Name] = s;
            layout.Sites.Add(new Site(site.Name, position));
            foreach (var o in site.Orbitals)
            {
                layout._orbitalIndex[(s, o)] = layout.Orbitals.Count;
                layout.Orbitals.Add(new Orbital(o, s, OrbitalKind.Conduction));
            }
            if (site.Shell is { } shell)
            {
                if (shell.Degeneracy is int n && n != flavours)
                    throw new ModelError(shell.Location, $"{shell.Field}.degeneracy",
                        $"degeneracy {n} must equal the model's flavours = {flavours} (every orbital carries the same flavours)");
                double q = shell.Constraint.EvaluateReal(env);
                // The solver needs room for the boson: n_f + r^2 = Q with n_f < N (SaddlePointSolver refuses Q >= N).
                if (!(q > 0 && q < flavours))
                    throw new ModelError(shell.Constraint.Location, shell.Constraint.Field, $"constraint Q = {q:G6} must lie in (0, {flavours}) (0 < Q < N = flavours)");
                double level = PhysicalRange.CheckEnergy(shell.Level.EvaluateReal(env), spec.Header.Unit, shell.Level.Location, shell.Level.Field, "level");
                double u = double.PositiveInfinity;
                if (shell.U is { } uExpr)
                {
                    u = PhysicalRange.CheckEnergy(uExpr.EvaluateReal(env), spec.Header.Unit, uExpr.Location, uExpr.Field, "U");
                    if (u < 0)
                        throw new ModelError(uExpr.Location, uExpr.Field, $"U = {u:G6} is negative: the on-site repulsion must be >= 0");
                    // The four-boson representation (e, p_sigma, d) of Kotliar & Ruckenstein is for N = 2 only.
                    if (flavours != 2)
                        throw new ModelError(uExpr.Location, uExpr.Field, $"finite U needs a shell with N = 2 flavours, found N = {flavours} (omit U for infinite U)");
                }
                layout._orbitalIndex[(s, shell.Name)] = layout.Orbitals.Count;
                layout.Shells.Add(new CorrelatedShell(layout.Orbitals.Count, flavours, q, level, shell.Group ?? site.Name, u));
                layout.Orbitals.Add(new Orbital(shell.Name, s, OrbitalKind.Correlated));
            }
        }
        if (layout.Orbitals.Count == 0)
            throw new ModelError(spec.Sites[0].Location, "site", "empty model: no site has orbitals or a shell");
        return layout;
    }

    /// <summary>Index of the orbital "site:name"; unknown names are errors with the closest valid name.</summary>
    public int Resolve(OrbitalRef r)
    {
        if (!_siteIndex.TryGetValue(r.Site, out int s))
            throw new ModelError(r.Location, r.Field, $"site '{r.Site}' does not exist", NameSuggestion.Closest(r.Site, _siteIndex.Keys));
        if (_orbitalIndex.TryGetValue((s, r.Orbital), out int o)) return o;
        var names = OrbitalNames(s).ToList();
        throw new ModelError(r.Location, r.Field, $"site '{r.Site}' has no orbital '{r.Orbital}' (it has {string.Join(", ", names.Select(n => $"'{n}'"))})",
            NameSuggestion.Closest(r.Orbital, names));
    }

    public bool TryFindSite(string name, out int index) => _siteIndex.TryGetValue(name, out index);

    public IEnumerable<string> SiteNames => _siteIndex.Keys;

    public IEnumerable<string> OrbitalNames(int site) => Orbitals.Where(o => o.Site == site).Select(o => o.Name);

    /// <summary>Index of orbital <paramref name="name"/> on site <paramref name="site"/>, or -1.</summary>
    public int Find(int site, string name) => _orbitalIndex.TryGetValue((site, name), out int o) ? o : -1;
}
