using System.Globalization;
using System.Numerics;
using System.Text;
using Meanfield.Binding;
using Meanfield.Lattices;

namespace Meanfield.Output;

/// <summary>
/// The plain-text real-space hopping table read by tight-binding and Wannier-function tools: a comment line, the number
/// of basis functions, the number of lattice vectors R, the degeneracy of each R (15 per line), then one row
/// "n1 n2 n3 i j Re(t) Im(t)" per R and basis pair with 1-based indices, i the row. H(k) = sum_R e^{ik.R} t(R) / deg(R):
/// the phases carry R only (Bloch convention I), which has the same eigenvalues as meanfield's convention II.
/// </summary>
public sealed class HoppingTable
{
    public int BasisSize { get; }
    public IReadOnlyList<(int N1, int N2, int N3)> Vectors { get; }
    public IReadOnlyList<int> Degeneracy { get; }
    /// <summary>t(R) as BasisSize x BasisSize row-major blocks, one per lattice vector.</summary>
    public IReadOnlyList<Complex[]> Blocks { get; }
    public string Comment { get; }

    public HoppingTable(int basisSize, IReadOnlyList<(int, int, int)> vectors, IReadOnlyList<int> degeneracy,
                        IReadOnlyList<Complex[]> blocks, string comment)
    {
        BasisSize = basisSize; Vectors = vectors; Degeneracy = degeneracy; Blocks = blocks; Comment = comment;
    }

    /// <summary>The table of a bound model (use the renormalized model for the heavy quasiparticles).</summary>
    public static HoppingTable FromModel(BoundModel model, string comment)
    {
        int n = model.BasisSize, f = model.Flavours;
        var index = new Dictionary<(int, int, int), Complex[]>();
        Complex[] Block((int, int, int) r)
        {
            if (!index.TryGetValue(r, out var b)) index[r] = b = new Complex[n * n];
            return b;
        }
        var home = Block((0, 0, 0));
        foreach (var o in model.Onsite)
            for (int a = 0; a < f; a++)
                for (int c = 0; c < f; c++) home[(o.Orbital * f + a) * n + o.Orbital * f + c] += o.Amplitude[a, c];
        foreach (var s in model.Shells)
            for (int a = 0; a < f; a++) home[(s.Orbital * f + a) * n + s.Orbital * f + a] += s.Level;
        foreach (var h in model.Hoppings)
        {
            var plus = Block(h.R); var minus = Block((-h.R.N1, -h.R.N2, -h.R.N3));
            for (int a = 0; a < f; a++)
                for (int c = 0; c < f; c++)
                {
                    var t = h.Amplitude[a, c];
                    plus[(h.From * f + a) * n + h.To * f + c] += t;
                    minus[(h.To * f + c) * n + h.From * f + a] += Complex.Conjugate(t);
                }
        }
        var keys = index.Keys.OrderBy(k => k.Item1).ThenBy(k => k.Item2).ThenBy(k => k.Item3).ToList();
        return new HoppingTable(n, keys, [.. keys.Select(_ => 1)], [.. keys.Select(k => index[k])], comment);
    }

    public string ToText()
    {
        var inv = CultureInfo.InvariantCulture;
        var sb = new StringBuilder();
        sb.Append(Comment.Replace('\n', ' ')).Append('\n');
        sb.Append(inv, $"{BasisSize,12}\n{Vectors.Count,12}\n");
        for (int i = 0; i < Degeneracy.Count; i++)
            sb.Append(inv, $"{Degeneracy[i],5}").Append((i + 1) % 15 == 0 || i + 1 == Degeneracy.Count ? "\n" : "");
        for (int r = 0; r < Vectors.Count; r++)
        {
            var (a, b, c) = Vectors[r];
            for (int j = 0; j < BasisSize; j++)
                for (int i = 0; i < BasisSize; i++)
                {
                    var t = Blocks[r][i * BasisSize + j];
                    sb.Append(inv, $"{a,5}{b,5}{c,5}{i + 1,5}{j + 1,5}{t.Real,24:E14}{t.Imaginary,24:E14}\n");
                }
        }
        return sb.ToString();
    }

    public void Save(string path) => AtomicFile.WriteText(path, ToText());

    /// <summary>Reads a table; malformed input gives an <see cref="InvalidDataException"/> with file and line.</summary>
    public static HoppingTable Load(string path)
    {
        var lines = File.ReadAllLines(path);
        int line = 0;
        string Next() => line < lines.Length ? lines[line++] : throw new InvalidDataException($"{path}:{line}: table ends early");
        int Int(string s, string what) => int.TryParse(s, NumberStyles.Integer, CultureInfo.InvariantCulture, out var v)
            ? v : throw new InvalidDataException($"{path}:{line}: {what} '{s}' is not an integer");
        double Dbl(string s) => double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out var v)
            ? v : throw new InvalidDataException($"{path}:{line}: '{s}' is not a number");
        var comment = Next();
        int n = Int(Next().Trim(), "basis size"), count = Int(Next().Trim(), "number of lattice vectors");
        var deg = new List<int>();
        while (deg.Count < count)
            foreach (var tok in Next().Split(' ', StringSplitOptions.RemoveEmptyEntries)) deg.Add(Int(tok, "degeneracy"));
        var vectors = new List<(int, int, int)>(); var blocks = new List<Complex[]>();
        for (int r = 0; r < count; r++)
        {
            var block = new Complex[n * n];
            for (int e = 0; e < n * n; e++)
            {
                var tok = Next().Split(' ', StringSplitOptions.RemoveEmptyEntries);
                if (tok.Length != 7) throw new InvalidDataException($"{path}:{line}: expected 7 columns, found {tok.Length}");
                var v = (Int(tok[0], "n1"), Int(tok[1], "n2"), Int(tok[2], "n3"));
                if (e == 0) vectors.Add(v);
                else if (v != vectors[^1]) throw new InvalidDataException($"{path}:{line}: lattice vector changes inside a block");
                int i = Int(tok[3], "i") - 1, j = Int(tok[4], "j") - 1;
                if (i < 0 || i >= n || j < 0 || j >= n) throw new InvalidDataException($"{path}:{line}: orbital index out of range 1..{n}");
                block[i * n + j] = new Complex(Dbl(tok[5]), Dbl(tok[6]));
            }
            blocks.Add(block);
        }
        return new HoppingTable(n, vectors, deg, blocks, comment);
    }

    /// <summary>H(k) = sum_R e^{ik.R} t(R) / deg(R) for a Cartesian k (inverse angstrom) on the given lattice.</summary>
    public void Assemble(Lattice lattice, Vec3 k, Span<Complex> h)
    {
        int n = BasisSize;
        h[..(n * n)].Clear();
        for (int r = 0; r < Vectors.Count; r++)
        {
            var (a, b, c) = Vectors[r];
            var (s, co) = Math.SinCos(k.Dot(lattice.LatticeVector(a, b, c)));
            var phase = new Complex(co, s) / Degeneracy[r];
            var block = Blocks[r];
            for (int e = 0; e < n * n; e++) h[e] += block[e] * phase;
        }
    }
}
