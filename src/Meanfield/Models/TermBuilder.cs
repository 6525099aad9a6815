using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Models;

/// <summary>Turns the term blocks of a model file into bound hoppings and on-site terms, checking names and kinds.</summary>
internal sealed class TermBuilder(ModelSpec spec, Lattice lattice, UnitCellLayout layout, IReadOnlyDictionary<string, Complex> env)
{
    private readonly int _flavours = spec.Header.Flavours;
    private readonly Dictionary<(int, int, (int, int, int)), BondSpec> _explicitBonds = [];
    private readonly Dictionary<(int, int, int), BondSpec> _shells = [];
    public List<Hopping> Hoppings { get; } = [];
    public List<OnsiteTerm> Onsite { get; } = [];

    public void AddAll()
    {
        foreach (var b in spec.Bonds) AddBond(b);
        foreach (var o in spec.Onsite) AddOnsite(o);
        foreach (var s in spec.Staggered) AddStaggered(s);
        if (spec.Zeeman is { } z) AddZeeman(z);
        foreach (var so in spec.SpinOrbit) AddSpinOrbit(so);
    }

    private static string Source(string field, SourceLocation where) => where.Line is int l ? $"{field} (line {l})" : field;

    private FlavourMatrix Matrix(AmplitudeSpec a)
    {
        if (!a.IsPauli) return FlavourMatrix.Identity(_flavours, Energy(a.Scalar!, a.Scalar!.Evaluate(env)));
        if (_flavours != 2)
            throw new ModelError(a.Location, a.Field, $"spin (Pauli) matrices need flavours = 2, but the model has flavours = {_flavours}");
        Complex V(ModelExpression? e) => e is null ? Complex.Zero : Energy(e, e.Evaluate(env));
        return FlavourMatrix.Pauli(V(a.Identity), V(a.X), V(a.Y), V(a.Z));
    }

    /// <summary>The value of an energy expression, after checking it lies in <see cref="PhysicalRange"/>.</summary>
    private Complex Energy(ModelExpression e, Complex value)
    {
        PhysicalRange.CheckEnergy(Complex.Abs(value), spec.Header.Unit, e.Location, e.Field, "|amplitude|");
        return value;
    }

    private double Energy(ModelExpression e, double value) =>
        PhysicalRange.CheckEnergy(value, spec.Header.Unit, e.Location, e.Field, "amplitude");

    private static string KindName(BondKind k) => k switch
    {
        BondKind.Hopping => "hopping", BondKind.Hybridization => "hybridization", _ => "ff_hopping",
    };

    private void AddBond(BondSpec b)
    {
        int from = layout.Resolve(b.From), to = layout.Resolve(b.To);
        bool fromF = layout.Orbitals[from].Kind == OrbitalKind.Correlated, toF = layout.Orbitals[to].Kind == OrbitalKind.Correlated;
        switch (b.Kind)
        {
            case BondKind.Hopping when fromF || toF:
                var f = fromF ? b.From : b.To;
                throw new ModelError(f.Location, f.Field, $"'{f}' is a correlated shell: use [[hybridization]] (conduction to shell) or [[ff_hopping]] (shell to shell)");
            case BondKind.Hybridization when !toF:
                throw new ModelError(b.To.Location, b.To.Field, $"hybridization must end on a correlated shell, but '{b.To}' is a conduction orbital");
            case BondKind.Hybridization when fromF:
                throw new ModelError(b.From.Location, b.From.Field, $"hybridization must start on a conduction orbital, but '{b.From}' is a correlated shell: use [[ff_hopping]]");
            case BondKind.FfHopping when !fromF || !toF:
                var c = !fromF ? b.From : b.To;
                throw new ModelError(c.Location, c.Field, $"ff_hopping joins two correlated shells, but '{c}' is a conduction orbital");
        }
        if (lattice.Kind.IsMomentumFree() && (b.Kind != BondKind.Hybridization || b.Neighbour is not null || b.Vector != (0, 0, 0)))
            throw new ModelError(b.Location, b.Field, $"a momentum-free ({spec.Lattice.Kind}) lattice has no bonds between cells: only on-site [[hybridization]] is allowed");
        var amplitude = Matrix(b.Amplitude);
        string source = Source(b.Field, b.Location);
        if (b.Vector is { } r)
        {
            if (lattice.Dimension == 2 && r.N3 != 0)
                throw new ModelError(b.Location, $"{b.Field}.vector", "a two-dimensional lattice needs n3 = 0");
            if (from == to && r == (0, 0, 0))
                throw new ModelError(b.Location, $"{b.Field}.vector", "a bond from an orbital to itself in the same cell is an on-site energy: use [[onsite]]");
            var key = from < to || (from == to && NeighbourShells.IsPositive(r)) ? (from, to, r) : (to, from, (-r.N1, -r.N2, -r.N3));
            if (_explicitBonds.TryGetValue(key, out var first))
                throw new ModelError(b.Location, b.Field,
                    $"duplicated term: the same bond (or its reverse) is already given by {first.Field} (line {first.Location.Line}); the Hermitian conjugate is implied");
            _explicitBonds[key] = b;
            Hoppings.Add(new Hopping(from, to, r, amplitude, source));
            return;
        }
        int shell = b.Neighbour!.Value;
        var shellKey = (Math.Min(from, to), Math.Max(from, to), shell);
        if (_shells.TryGetValue(shellKey, out var firstShell))
            throw new ModelError(b.Location, b.Field,
                $"duplicated term: neighbour shell {shell} between these orbitals is already given by {firstShell.Field} (line {firstShell.Location.Line})");
        _shells[shellKey] = b;
        var tauFrom = layout.Sites[layout.Orbitals[from].Site].Position;
        var tauTo = layout.Sites[layout.Orbitals[to].Site].Position;
        var bonds = NeighbourShells.Bonds(lattice, tauFrom, tauTo, shell, oneOfEachPair: from == to);
        if (bonds.Count == 0)
            throw new ModelError(b.Location, $"{b.Field}.neighbour", $"neighbour shell {shell} from '{b.From}' to '{b.To}' has no bonds");
        foreach (var bond in bonds) Hoppings.Add(new Hopping(from, to, bond, amplitude, source));
    }

    private void AddOnsite(OnsiteSpec o)
    {
        int orbital = layout.Resolve(o.Orbital);
        var m = Matrix(o.Energy);
        if (!m.IsHermitian(1e-12 * Math.Max(1, m.MaxAbs())))
            throw new ModelError(o.Energy.Location, o.Energy.Field,
                "on-site matrix is not Hermitian: the energy and the identity, x, y, z coefficients must be real");
        Onsite.Add(new OnsiteTerm(orbital, m, Source(o.Field, o.Location)));
    }

    private void AddStaggered(StaggeredSpec s)
    {
        var carriers = Enumerable.Range(0, layout.Sites.Count).Where(site => layout.Find(site, s.Orbital) >= 0).ToList();
        if (carriers.Count == 0)
            throw new ModelError(s.Location, $"{s.Field}.orbital", $"no site has an orbital '{s.Orbital}'",
                NameSuggestion.Closest(s.Orbital, layout.Orbitals.Select(o => o.Name).Distinct()));
        double m = Energy(s.Amplitude, s.Amplitude.EvaluateReal(env));
        var signs = new List<(int Site, double Sign)>();
        if (s.Signs is null)
        {
            if (carriers.Count != 2)
                throw new ModelError(s.Location, $"{s.Field}.signs",
                    $"{carriers.Count} sites carry orbital '{s.Orbital}': give signs = {{ SITE = 1, ... }} (the default +1, -1 needs exactly two)");
            signs.Add((carriers[0], 1)); signs.Add((carriers[1], -1));
        }
        else
            foreach (var sign in s.Signs)
            {
                string field = $"{s.Field}.signs.{sign.Site}";
                if (!layout.TryFindSite(sign.Site, out int site))
                    throw new ModelError(sign.Location, field, $"site '{sign.Site}' does not exist", NameSuggestion.Closest(sign.Site, layout.SiteNames));
                if (layout.Find(site, s.Orbital) < 0)
                    throw new ModelError(sign.Location, field, $"site '{sign.Site}' has no orbital '{s.Orbital}'");
                signs.Add((site, sign.Sign));
            }
        foreach (var (site, sign) in signs)
            Onsite.Add(new OnsiteTerm(layout.Find(site, s.Orbital), FlavourMatrix.Identity(_flavours, sign * m), Source(s.Field, s.Location)));
    }

    private void AddZeeman(ZeemanSpec z)
    {
        if (_flavours != 2)
            throw new ModelError(z.Location, "zeeman", $"a Zeeman field needs flavours = 2, but the model has flavours = {_flavours}");
        var b = z.Field.Select(e => Energy(e, e.EvaluateReal(env))).ToArray();
        var m = FlavourMatrix.Pauli(0, b[0], b[1], b[2]);
        for (int o = 0; o < layout.Orbitals.Count; o++)
        {
            var kind = layout.Orbitals[o].Kind;
            if (z.ActsOn == ZeemanTarget.All || (z.ActsOn == ZeemanTarget.Conduction) == (kind == OrbitalKind.Conduction))
                Onsite.Add(new OnsiteTerm(o, m, Source("zeeman", z.Location)));
        }
    }

    private void AddSpinOrbit(SpinOrbitDiamondSpec so)
    {
        if (lattice.Kind != LatticeKind.Diamond)
            throw new ModelError(so.Location, so.Field, $"the Fu-Kane-Mele term needs lattice kind = \"diamond\", not {spec.Lattice.Kind}");
        if (_flavours != 2)
            throw new ModelError(so.Location, so.Field, $"spin-orbit coupling needs flavours = 2, but the model has flavours = {_flavours}");
        var carriers = Enumerable.Range(0, layout.Sites.Count).Where(site => layout.Find(site, so.Orbital) >= 0).ToList();
        if (carriers.Count == 0)
            throw new ModelError(so.Location, $"{so.Field}.orbital", $"no site has an orbital '{so.Orbital}'",
                NameSuggestion.Closest(so.Orbital, layout.Orbitals.Select(o => o.Name).Distinct()));
        var lambda = Energy(so.Amplitude, so.Amplitude.Evaluate(env));
        var positions = layout.Sites.Select(s => s.Position).ToList();
        foreach (int site in carriers)
        {
            var bonds = FuKaneMeleTerm.Bonds(lattice, positions, site)
                ?? throw new ModelError(so.Location, so.Field, $"site '{layout.Sites[site].Name}' has no unique nearest-neighbour path to its next-nearest neighbours (is it a diamond site?)");
            int o = layout.Find(site, so.Orbital);
            foreach (var bond in bonds)
            {
                // i lambda (8/a^2) (d1 x d2).sigma, Fu, Kane and Mele, PRL 98, 106803 (2007), eq. 1.
                var c = Complex.ImaginaryOne * lambda;
                Hoppings.Add(new Hopping(o, o, bond.R, FlavourMatrix.Pauli(0, c * bond.V.X, c * bond.V.Y, c * bond.V.Z), Source(so.Field, so.Location)));
            }
        }
    }
}
