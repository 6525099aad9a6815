namespace Meanfield.Lattices;

/// <summary>
/// Brillouin-zone labels and the standard band paths of the built-in lattices (Setyawan &amp; Curtarolo,
/// Comput. Mater. Sci. 49, 299 (2010)). Points are stored in Cartesian units of 2 pi / a, with a the lattice constant
/// (the conventional cube edge for the cubic kinds); <see cref="Cartesian"/> turns them into inverse angstrom.
/// The zone centre is stored as "G"; "Gamma" and "Γ" are accepted on input and it is printed as Γ.
/// </summary>
public static class HighSymmetryPoints
{
    private static readonly double Sqrt3 = Math.Sqrt(3);

    private static readonly IReadOnlyDictionary<string, Vec3> SimpleCubic = new Dictionary<string, Vec3>
    {
        ["G"] = Vec3.Zero, ["X"] = new(0, 0.5, 0), ["M"] = new(0.5, 0.5, 0), ["R"] = new(0.5, 0.5, 0.5),
    };

    private static readonly IReadOnlyDictionary<string, Vec3> FaceCentred = new Dictionary<string, Vec3>
    {
        ["G"] = Vec3.Zero, ["X"] = new(0, 1, 0), ["W"] = new(0.5, 1, 0), ["K"] = new(0.75, 0.75, 0),
        ["L"] = new(0.5, 0.5, 0.5), ["U"] = new(0.25, 1, 0.25),
    };

    private static readonly IReadOnlyDictionary<string, Vec3> BodyCentred = new Dictionary<string, Vec3>
    {
        ["G"] = Vec3.Zero, ["H"] = new(0, 0, 1), ["N"] = new(0.5, 0.5, 0), ["P"] = new(0.5, 0.5, 0.5),
    };

    private static readonly IReadOnlyDictionary<string, Vec3> Square = new Dictionary<string, Vec3>
    {
        ["G"] = Vec3.Zero, ["X"] = new(0.5, 0, 0), ["M"] = new(0.5, 0.5, 0),
    };

    // For a1 = (a, 0, 0), a2 = (a/2, a sqrt3/2, 0): M = b1/2 and K = (2 b1 + b2)/3.
    private static readonly IReadOnlyDictionary<string, Vec3> Hexagonal = new Dictionary<string, Vec3>
    {
        ["G"] = Vec3.Zero, ["M"] = new(0.5, -0.5 / Sqrt3, 0), ["K"] = new(2.0 / 3.0, 0, 0),
    };

    /// <summary>Labels and points (Cartesian, units of 2 pi / a) of a lattice kind; null when the kind has no table.</summary>
    public static IReadOnlyDictionary<string, Vec3>? For(LatticeKind kind) => kind switch
    {
        LatticeKind.SimpleCubic => SimpleCubic,
        LatticeKind.FaceCentredCubic or LatticeKind.Diamond => FaceCentred,
        LatticeKind.BodyCentredCubic => BodyCentred,
        LatticeKind.Square => Square,
        LatticeKind.Honeycomb => Hexagonal,
        _ => null,
    };

    /// <summary>The standard path of a lattice kind ('-' joins points, '|' breaks the path), or null.</summary>
    public static string? DefaultPath(LatticeKind kind) => kind switch
    {
        LatticeKind.SimpleCubic => "G-X-M-G-R-X|M-R",
        LatticeKind.FaceCentredCubic or LatticeKind.Diamond => "G-X-W-K-G-L-U-W-L-K|U-X",
        LatticeKind.BodyCentredCubic => "G-H-N-G-P-H|P-N",
        LatticeKind.Square => "G-X-M-G",
        LatticeKind.Honeycomb => "G-M-K-G",
        _ => null,
    };

    /// <summary>The stored form of a label: "Gamma", "GAMMA", "Γ" and "g" become "G"; other labels are upper-cased.</summary>
    public static string Canonical(string label)
    {
        var t = label.Trim();
        if (t.Equals("gamma", StringComparison.OrdinalIgnoreCase) || t == "Γ" || t == "\\Gamma") return "G";
        return t.ToUpperInvariant();
    }

    /// <summary>The label as printed in plots: Γ for the zone centre.</summary>
    public static string Display(string label)
    {
        var c = Canonical(label);
        return c == "G" ? "Γ" : c;
    }

    /// <summary>Cartesian wave vector (inverse angstrom) of a labelled point of <paramref name="lattice"/>.</summary>
    /// <exception cref="RequestError">The label is unknown for this lattice (the message lists the valid ones).</exception>
    public static Vec3 Cartesian(Lattice lattice, string label)
    {
        var table = For(lattice.Kind) ?? throw new RequestError(
            $"Lattice kind {lattice.Kind} has no named Brillouin-zone points: give the path as reduced coordinates, " +
            "for example \"0,0,0 0.5,0,0 0.5,0.5,0\".");
        if (!table.TryGetValue(Canonical(label), out var p))
            throw new RequestError(
                $"Unknown Brillouin-zone label '{label}' for lattice kind {lattice.Kind}; valid labels: " +
                $"{string.Join(", ", table.Keys.Select(k => k == "G" ? "G (Gamma)" : k))}.");
        return (2 * Math.PI / lattice.Constant) * p;
    }
}
