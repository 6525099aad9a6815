using System.Globalization;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Surfaces;

/// <summary>The 2D Bravais type of a surface lattice, which fixes the labels of its zone.</summary>
public enum SurfaceLatticeType { Square, Hexagonal, Rectangular, Oblique }

/// <summary>
/// The surface Brillouin zone of a <see cref="LatticePlane"/>: in-plane reciprocal vectors b1, b2 (b_i.A_j = 2 pi
/// delta_ij, inverse angstrom), the 2D lattice type, labelled points and the standard path. Labels are the trade's
/// surface-zone names: square Γ, X = b1/2, M = (b1+b2)/2; hexagonal Γ, M = b1/2, K = (b1+b2)/3 (b1, b2 at 60 degrees);
/// rectangular Γ, X = b1/2, Y = b2/2, S = (b1+b2)/2; any other (centred-rectangular or oblique) lattice gets the four
/// time-reversal-invariant points Γ, X = b1/2, Y = b2/2, M = (b1+b2)/2. Labels are stored as "G", "X", ... and drawn
/// with an overbar. In-plane Cartesian axes for maps: e1 along A1, e2 = normal x e1.
/// </summary>
public sealed class SurfaceZone
{
    /// <summary>Relative tolerance for equal lengths and right or 120-degree angles of the surface lattice.</summary>
    public const double ShapeTolerance = 1e-6;

    public LatticePlane Plane { get; }
    public Vec3 B1 { get; }
    public Vec3 B2 { get; }
    public SurfaceLatticeType Type { get; }
    /// <summary>In-plane unit axes of maps.</summary>
    public Vec3 E1 { get; }
    public Vec3 E2 { get; }
    /// <summary>Labelled points (Cartesian, inverse angstrom).</summary>
    public IReadOnlyDictionary<string, Vec3> Points { get; }
    /// <summary>The four time-reversal-invariant momenta Γ, b1/2, b2/2, (b1+b2)/2 with their labels.</summary>
    public IReadOnlyList<(string Label, Vec3 K)> InvariantMomenta { get; }
    /// <summary>The standard path ('-' joins, '|' breaks).</summary>
    public string DefaultPath { get; }
    /// <summary>Corners of the Wigner-Seitz cell of the surface zone, counter-clockwise in (e1, e2) coordinates.</summary>
    public IReadOnlyList<(double S1, double S2)> Boundary { get; }

    public SurfaceZone(LatticePlane plane)
    {
        Plane = plane;
        var n = plane.Normal;
        double area = plane.A1.Cross(plane.A2).Dot(n);
        B1 = (2 * Math.PI / area) * plane.A2.Cross(n);
        B2 = (2 * Math.PI / area) * n.Cross(plane.A1);
        E1 = plane.A1 / plane.A1.Norm; E2 = n.Cross(E1);
        double l1 = plane.A1.Norm, l2 = plane.A2.Norm, cos = plane.A1.Dot(plane.A2) / (l1 * l2);
        bool equal = Math.Abs(l1 - l2) <= ShapeTolerance * l1;
        Type = Math.Abs(cos) <= ShapeTolerance ? (equal ? SurfaceLatticeType.Square : SurfaceLatticeType.Rectangular)
             : equal && Math.Abs(cos + 0.5) <= ShapeTolerance ? SurfaceLatticeType.Hexagonal
             : SurfaceLatticeType.Oblique;
        var pts = new Dictionary<string, Vec3> { ["G"] = Vec3.Zero };
        switch (Type)
        {
            case SurfaceLatticeType.Square: pts["X"] = 0.5 * B1; pts["M"] = 0.5 * (B1 + B2); DefaultPath = "G-X-M-G"; break;
            case SurfaceLatticeType.Hexagonal: pts["M"] = 0.5 * B1; pts["K"] = (B1 + B2) / 3; DefaultPath = "G-M-K-G"; break;
            case SurfaceLatticeType.Rectangular:
                pts["X"] = 0.5 * B1; pts["Y"] = 0.5 * B2; pts["S"] = 0.5 * (B1 + B2); DefaultPath = "G-X-S-Y-G-S"; break;
            default: pts["X"] = 0.5 * B1; pts["Y"] = 0.5 * B2; pts["M"] = 0.5 * (B1 + B2); DefaultPath = "G-X-M-Y-G-M"; break;
        }
        Points = pts;
        InvariantMomenta = Type switch
        {
            SurfaceLatticeType.Hexagonal => [("G", Vec3.Zero), ("M", 0.5 * B1), ("M", 0.5 * B2), ("M", 0.5 * (B1 + B2))],
            SurfaceLatticeType.Square => [("G", Vec3.Zero), ("X", 0.5 * B1), ("X", 0.5 * B2), ("M", 0.5 * (B1 + B2))],
            SurfaceLatticeType.Rectangular => [("G", Vec3.Zero), ("X", 0.5 * B1), ("Y", 0.5 * B2), ("S", 0.5 * (B1 + B2))],
            _ => [("G", Vec3.Zero), ("X", 0.5 * B1), ("Y", 0.5 * B2), ("M", 0.5 * (B1 + B2))],
        };
        Boundary = WignerSeitz();
    }

    /// <summary>In-plane map coordinates (s1, s2) = (k.e1, k.e2) of a wave vector.</summary>
    public (double S1, double S2) MapCoordinates(Vec3 k) => (k.Dot(E1), k.Dot(E2));

    /// <summary>The in-plane wave vector at map coordinates (s1, s2).</summary>
    public Vec3 FromMap(double s1, double s2) => s1 * E1 + s2 * E2;

    /// <summary>Projection of a bulk wave vector onto the surface plane, folded to the image nearest Γ.</summary>
    public Vec3 Project(Vec3 k)
    {
        var p = k - k.Dot(Plane.Normal) * Plane.Normal;
        double u1 = p.Dot(Plane.A1) / (2 * Math.PI), u2 = p.Dot(Plane.A2) / (2 * Math.PI);
        var q = p - Math.Round(u1) * B1 - Math.Round(u2) * B2;
        var best = q;
        for (int i = -1; i <= 1; i++)
            for (int j = -1; j <= 1; j++)
            {
                var c = q + i * B1 + j * B2;
                if (c.Norm < best.Norm - 1e-12) best = c;
            }
        return best;
    }

    /// <summary>The label as drawn: the zone centre as Γ, every label with a combining overbar.</summary>
    public static string Display(string label) => HighSymmetryPoints.Display(label) + "\u0304";

    /// <summary>
    /// A path of the surface zone: labels of <see cref="Points"/> or reduced coordinates "u1,u2" along b1, b2,
    /// optionally named ("A=0.25,0"); '-' or spaces join, '|' breaks.
    /// </summary>
    /// <exception cref="RequestError">Unknown label (the valid ones are listed) or malformed coordinates.</exception>
    public BandPath Path(string? spec)
    {
        var text = string.IsNullOrWhiteSpace(spec) || spec == "auto" ? DefaultPath : spec;
        var segments = new List<IReadOnlyList<PathPoint>>();
        foreach (var piece in text.Split('|'))
        {
            var list = new List<PathPoint>();
            foreach (var word in piece.Split([' ', '\t'], StringSplitOptions.RemoveEmptyEntries))
                foreach (var token in word.Contains(',') ? [word] : word.Split('-', StringSplitOptions.RemoveEmptyEntries))
                    list.Add(Point(token));
            segments.Add(list);
        }
        return new BandPath(SurfaceLattice(), segments);
    }

    private PathPoint Point(string token)
    {
        int eq = token.IndexOf('=');
        string body = eq >= 0 ? token[(eq + 1)..] : token;
        if (!body.Contains(','))
        {
            var c = HighSymmetryPoints.Canonical(token);
            if (Points.TryGetValue(c, out var k)) return new PathPoint(c, k);
            throw new RequestError($"--path: surface path point '{token}': the {Type.ToString().ToLowerInvariant()} surface zone has {string.Join(", ", Points.Keys)}");
        }
        var parts = body.Split(',');
        if (parts.Length != 2
            || !double.TryParse(parts[0], NumberStyles.Float, CultureInfo.InvariantCulture, out var u1)
            || !double.TryParse(parts[1], NumberStyles.Float, CultureInfo.InvariantCulture, out var u2)
            || !double.IsFinite(u1) || !double.IsFinite(u2))
            throw new RequestError($"--path: surface path point '{token}': give two reduced coordinates u1,u2 along the surface reciprocal vectors");
        return new PathPoint(eq >= 0 ? token[..eq].Trim() : body, u1 * B1 + u2 * B2);
    }

    /// <summary>A 2D lattice object carrying the surface vectors (for path sampling).</summary>
    private Lattice SurfaceLattice() => new(LatticeKind.Explicit, Plane.Lattice.Constant, 2, Plane.A1, Plane.A2, Plane.Spacing * Plane.Normal);

    // Clip a large square by the bisector half-planes k.G <= |G|^2 / 2 of the nearest reciprocal vectors.
    private List<(double, double)> WignerSeitz()
    {
        double r = 4 * Math.Max(B1.Norm, B2.Norm);
        var poly = new List<(double X, double Y)> { (-r, -r), (r, -r), (r, r), (-r, r) };
        for (int i = -2; i <= 2; i++)
            for (int j = -2; j <= 2; j++)
            {
                if (i == 0 && j == 0) continue;
                var (gx, gy) = MapCoordinates(i * B1 + j * B2);
                double lim = 0.5 * (gx * gx + gy * gy);
                var next = new List<(double X, double Y)>();
                for (int v = 0; v < poly.Count; v++)
                {
                    var p = poly[v]; var q = poly[(v + 1) % poly.Count];
                    double fp = p.X * gx + p.Y * gy - lim, fq = q.X * gx + q.Y * gy - lim;
                    if (fp <= 0) next.Add(p);
                    if (fp * fq < 0)
                    {
                        double t = fp / (fp - fq);
                        next.Add((p.X + t * (q.X - p.X), p.Y + t * (q.Y - p.Y)));
                    }
                }
                poly = next;
            }
        return poly;
    }
}
