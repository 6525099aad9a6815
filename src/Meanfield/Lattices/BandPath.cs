using System.Globalization;

namespace Meanfield.Lattices;

/// <summary>
/// A path through the Brillouin zone made of continuous pieces of straight legs between labelled points.
/// Written as text, '-' or whitespace joins consecutive points and '|' breaks the path ("G-X-W|L-G" or "G X W | L G").
/// A point is a Brillouin-zone label of the lattice (see <see cref="HighSymmetryPoints"/>) or reduced coordinates
/// "u1,u2,u3" (2D lattices: "u1,u2"), optionally named: "A=0.5,0,0". Reduced coordinates are along the primitive
/// reciprocal vectors b_i, so k = u1 b1 + u2 b2 + u3 b3.
/// </summary>
public sealed class BandPath
{
    public Lattice Lattice { get; }
    /// <summary>The continuous pieces of the path, each with at least two points.</summary>
    public IReadOnlyList<IReadOnlyList<PathPoint>> Segments { get; }

    /// <summary>A path of the given pieces.</summary>
    /// <exception cref="RequestError">No piece, a piece of fewer than two points, or two consecutive points that coincide
    /// (a path as the user wrote it).</exception>
    public BandPath(Lattice lattice, IReadOnlyList<IReadOnlyList<PathPoint>> segments)
    {
        if (segments.Count == 0) throw new RequestError("A band path needs at least one segment.");
        foreach (var seg in segments)
        {
            if (seg.Count < 2)
                throw new RequestError($"Every piece of a band path needs at least two points; '{Describe(seg)}' has {seg.Count}.");
            for (int i = 1; i < seg.Count; i++)
                if ((seg[i].K - seg[i - 1].K).Norm < 1e-12)
                    throw new RequestError($"Consecutive path points {seg[i - 1].Label} and {seg[i].Label} coincide.");
        }
        Lattice = lattice; Segments = segments;
    }

    /// <summary>The standard path of a built-in lattice (Setyawan &amp; Curtarolo 2010).</summary>
    /// <exception cref="RequestError">The lattice has no standard path (explicit vectors, momentum-free).</exception>
    public static BandPath Default(Lattice lattice)
    {
        var spec = HighSymmetryPoints.DefaultPath(lattice.Kind) ?? throw new RequestError(
            lattice.Kind.IsMomentumFree()
                ? $"Lattice kind {lattice.Kind} has no momentum and no band path."
                : $"Lattice kind {lattice.Kind} has no standard band path: give one with --path in reduced coordinates, " +
                  "for example --path \"0,0,0 0.5,0,0 0.5,0.5,0 | 0,0,0 0.5,0.5,0.5\".");
        return Parse(spec, lattice);
    }

    /// <summary>Reads a path written as text (see the class summary).</summary>
    /// <exception cref="RequestError">Unknown label (the message names it and lists the valid ones), malformed coordinates, or a piece with fewer than two points.</exception>
    public static BandPath Parse(string spec, Lattice lattice)
    {
        if (lattice.Kind.IsMomentumFree())
            throw new RequestError($"Lattice kind {lattice.Kind} has no momentum and no band path.");
        if (string.IsNullOrWhiteSpace(spec)) throw new RequestError("--path: the band path is empty.");
        var segments = new List<IReadOnlyList<PathPoint>>();
        foreach (var piece in spec.Split('|'))
        {
            var points = new List<PathPoint>();
            foreach (var word in piece.Split((char[])[' ', '\t', '\r', '\n'], StringSplitOptions.RemoveEmptyEntries))
            {
                // A coordinate token keeps its minus signs; elsewhere '-' joins labels.
                if (word.Contains(',')) { points.Add(ParsePoint(word, lattice, spec)); continue; }
                foreach (var token in word.Split('-', StringSplitOptions.RemoveEmptyEntries))
                    points.Add(ParsePoint(token, lattice, spec));
            }
            segments.Add(points);
        }
        try { return new BandPath(lattice, segments); }
        catch (RequestError e) { throw new RequestError($"--path \"{spec}\": {e.Message}", e); }
    }

    private static PathPoint ParsePoint(string token, Lattice lattice, string spec)
    {
        int eq = token.IndexOf('=');
        string name = eq >= 0 ? token[..eq] : token;
        string body = eq >= 0 ? token[(eq + 1)..] : token;
        if (!body.Contains(','))
        {
            try { return new PathPoint(HighSymmetryPoints.Canonical(token), HighSymmetryPoints.Cartesian(lattice, token)); }
            catch (RequestError e) { throw new RequestError($"--path \"{spec}\": {e.Message}", e); }
        }
        var parts = body.Split(',');
        int dim = Math.Max(lattice.Dimension, 2);
        if (parts.Length < 2 || parts.Length > 3 || (parts.Length == 2 && dim == 3))
            throw new RequestError($"--path \"{spec}\": point '{token}': reduced coordinates need {dim} comma-separated numbers.");
        var u = new double[3];
        for (int i = 0; i < parts.Length; i++)
            if (!double.TryParse(parts[i], NumberStyles.Float, CultureInfo.InvariantCulture, out u[i]) || !double.IsFinite(u[i]))
                throw new RequestError($"--path \"{spec}\": point '{token}': '{parts[i]}' is not a number.");
        if (lattice.Dimension < 3 && u[2] != 0)
            throw new RequestError($"--path \"{spec}\": point '{token}': a two-dimensional lattice has no third reduced coordinate.");
        return new PathPoint(eq >= 0 ? name.Trim() : body, lattice.Cartesian(u[0], u[1], u[2]));
    }

    private static string Describe(IReadOnlyList<PathPoint> seg) => string.Join("-", seg.Select(p => p.Label));

    /// <summary>The path written back as text, for example "G-X-M-G-R-X|M-R".</summary>
    public override string ToString() => string.Join("|", Segments.Select(Describe));

    /// <summary>Total length of the path in inverse angstrom (breaks add nothing).</summary>
    public double TotalLength => Segments.Sum(s => Enumerable.Range(1, s.Count - 1).Sum(i => (s[i].K - s[i - 1].K).Norm));

    /// <summary>
    /// Samples the path with <paramref name="pointsTotal"/> k-points, spread over the legs in proportion to their length
    /// (every leg at least one interval); both ends of every leg are included, so each vertex is sampled exactly once per
    /// piece, and a break repeats the path length of the previous point.
    /// </summary>
    /// <exception cref="RequestError">Fewer points than the path has legs and pieces (a count the user chose).</exception>
    public BandPathSample Sample(int pointsTotal)
    {
        int legs = Segments.Sum(s => s.Count - 1);
        int minimum = legs + Segments.Count;
        if (pointsTotal < minimum)
            throw new RequestError($"--points {pointsTotal}: the path {this} needs at least {minimum} k-points.");
        var legLength = Segments.SelectMany(s => Enumerable.Range(1, s.Count - 1).Select(i => (s[i].K - s[i - 1].K).Norm)).ToArray();
        var intervals = SplitIntervals(legLength, pointsTotal - Segments.Count);

        var k = new Vec3[pointsTotal];
        var length = new double[pointsTotal];
        var labels = new string[pointsTotal];
        var ticks = new List<PathTick>();
        var starts = new int[Segments.Count];
        int idx = 0, leg = 0;
        double x = 0;
        for (int s = 0; s < Segments.Count; s++)
        {
            var seg = Segments[s];
            starts[s] = idx;
            if (s > 0) ticks[^1] = ticks[^1] with { Index = idx, Label = ticks[^1].Label + "|" + seg[0].Label };
            else ticks.Add(new PathTick(idx, x, seg[0].Label));
            k[idx] = seg[0].K; length[idx] = x; labels[idx] = seg[0].Label; idx++;
            for (int i = 1; i < seg.Count; i++, leg++)
            {
                var from = seg[i - 1].K; var step = (seg[i].K - from) / intervals[leg];
                double start = x;
                for (int j = 1; j <= intervals[leg]; j++)
                {
                    k[idx] = j == intervals[leg] ? seg[i].K : from + j * step;
                    length[idx] = start + legLength[leg] * j / intervals[leg];
                    labels[idx] = j == intervals[leg] ? seg[i].Label : "";
                    idx++;
                }
                x = start + legLength[leg];
                ticks.Add(new PathTick(idx - 1, x, seg[i].Label));
            }
        }
        return new BandPathSample(k, length, labels, ticks, starts);
    }

    /// <summary>Splits <paramref name="budget"/> intervals over legs in proportion to length (largest remainder, at least 1 each).</summary>
    private static int[] SplitIntervals(double[] legLength, int budget)
    {
        double total = legLength.Sum();
        var ideal = legLength.Select(l => budget * l / total).ToArray();
        var n = ideal.Select(v => Math.Max(1, (int)Math.Floor(v))).ToArray();
        int excess = n.Sum() - budget;
        var byRemainder = Enumerable.Range(0, n.Length).OrderByDescending(i => ideal[i] - Math.Floor(ideal[i])).ToArray();
        for (int r = 0; excess < 0; r = (r + 1) % n.Length, excess++) n[byRemainder[r]]++;
        while (excess > 0)
        {
            int widest = Enumerable.Range(0, n.Length).OrderByDescending(i => n[i] - ideal[i]).First(i => n[i] > 1);
            n[widest]--; excess--;
        }
        return n;
    }
}
