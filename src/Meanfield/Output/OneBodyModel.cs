using System.Globalization;
using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Units;

namespace Meanfield.Output;

/// <summary>
/// A damaged or inconsistent exported model: the message names the file, the place (line, row or JSON path) and the
/// field. The command line reports it as bad input (exit 2).
/// </summary>
public sealed class OneBodyModelError(string file, string where, string field, string problem)
    : InputException($"{file}{(where.Length > 0 ? ":" + where : "")}: {field}: {problem}")
{
    /// <summary>The file that was read.</summary>
    public string File { get; } = file;
    /// <summary>Line (CSV), row (Parquet) or JSON path of the fault; empty for the file as a whole.</summary>
    public string Where { get; } = where;
    /// <summary>The field or column at fault.</summary>
    public string Field { get; } = field;
}

/// <summary>One orbital of the exported basis: its label "SITE:NAME", its site index and its kind.</summary>
public sealed record OneBodyOrbital(string Label, int Site, OrbitalKind Kind)
{
    /// <summary>The orbital name after the site prefix.</summary>
    public string Name => Label[(Label.IndexOf(':') + 1)..];
}

/// <summary>
/// Everything of an exported one-body model except its matrix elements: what it is, units, chemical potential and
/// temperature, lattice, basis (sites, orbitals, flavours), sampling and provenance. The same facts go into the JSON
/// fields, the CSV comment lines and the Parquet key-value metadata (see models/README.md, "Exported models").
/// </summary>
public sealed record OneBodyHeader
{
    /// <summary>Format tag of every exported model (JSON, CSV and Parquet).</summary>
    public const string FormatTag = "meanfield-one-body-model/1";

    /// <summary>Model name.</summary>
    public required string Model { get; init; }
    /// <summary>True when hybridization and f levels carry the saddle point's r and lambda.</summary>
    public required bool Renormalized { get; init; }
    /// <summary>Unit of every energy (amplitudes, mu, temperature).</summary>
    public required EnergyUnit Unit { get; init; }
    /// <summary>Chemical potential (energy unit).</summary>
    public required double Mu { get; init; }
    /// <summary>How the solve fixed mu (the solution file's `mu_rule`).</summary>
    public required string MuRule { get; init; }
    /// <summary>k_B T of the solution (energy unit).</summary>
    public required double Temperature { get; init; }
    /// <summary>Electrons per cell N_e.</summary>
    public required double ElectronsPerCell { get; init; }
    /// <summary>Formula units per cell (for per-mole quantities).</summary>
    public required double FormulaUnitsPerCell { get; init; }
    /// <summary>The lattice (kind, constant, dimension, vectors in angstrom).</summary>
    public required Lattice Lattice { get; init; }
    /// <summary>Flavour names in basis order (index = position).</summary>
    public required IReadOnlyList<string> Flavours { get; init; }
    /// <summary>Sites with Cartesian positions (angstrom).</summary>
    public required IReadOnlyList<Site> Sites { get; init; }
    /// <summary>Orbitals in basis order.</summary>
    public required IReadOnlyList<OneBodyOrbital> Orbitals { get; init; }
    /// <summary>k-mesh divisions of the solution's sampling (null when it had none).</summary>
    public int? Mesh { get; init; }
    /// <summary>Whether that mesh was shifted off Gamma.</summary>
    public bool Shifted { get; init; } = true;
    /// <summary>The file the model was exported from (absolute path; empty when unknown).</summary>
    public string Source { get; init; } = "";
    /// <summary>The model file behind it (absolute path) and the SHA-256 of its text.</summary>
    public string ModelPath { get; init; } = "";
    /// <summary>SHA-256 of the model text the solution was solved with.</summary>
    public string ModelSha256 { get; init; } = "";
    /// <summary>meanfield version that wrote the file.</summary>
    public string ToolVersion { get; init; } = "";
    /// <summary>Creation time, UTC.</summary>
    public string Created { get; init; } = "";

    /// <summary>Flavour names: up and down for spin-1/2, 1..F otherwise.</summary>
    public static IReadOnlyList<string> FlavourNames(int flavours) =>
        flavours == 2 ? ["up", "down"] : [.. Enumerable.Range(1, flavours).Select(i => i.ToString(CultureInfo.InvariantCulture))];

    /// <summary>The sentence every exported file carries about the Bloch phase.</summary>
    public const string PhaseText =
        "H_ab(k) = sum over the elements from a to b of t exp(i k.(R + tau_b - tau_a)), R = cell_a1 a1 + cell_a2 a2 + cell_a3 a3: "
        + "the Bloch phase includes the site positions tau; every element is listed (both directions of every bond), absent ones are zero";
}

/// <summary>One matrix element t = &lt;from, cell 0 | H | to, cell R&gt; of an exported model.</summary>
/// <param name="Where">Line, row or JSON path it was read from (for messages); empty when built in memory.</param>
public readonly record struct OneBodyElement((int N1, int N2, int N3) Cell, int From, int FromFlavour, int To, int ToFlavour,
                                             Complex Amplitude, string Where);

/// <summary>
/// The one-body model meanfield exports (the renormalized model of a solution, or a bare model): its header and every
/// matrix element. <see cref="FromModel"/> builds it, <see cref="Bind"/> turns a read file back into a
/// <see cref="BoundModel"/> without correlated shells (checked: names, ranges, Hermiticity, displacements).
/// </summary>
public sealed class OneBodyModel
{
    /// <summary>What the file says about itself.</summary>
    public OneBodyHeader Header { get; }
    /// <summary>Every non-zero matrix element, ordered by cell, from, from flavour, to, to flavour.</summary>
    public IReadOnlyList<OneBodyElement> Elements { get; }

    /// <summary>Wraps a header and its elements.</summary>
    public OneBodyModel(OneBodyHeader header, IReadOnlyList<OneBodyElement> elements) { Header = header; Elements = elements; }

    /// <summary>
    /// The model's full list of matrix elements: bonds in both directions (the implied Hermitian conjugate written
    /// out), on-site matrices and shell levels on the home cell's diagonal blocks.
    /// </summary>
    public static OneBodyModel FromModel(BoundModel model, OneBodyHeader header)
    {
        int f = model.Flavours;
        var blocks = new Dictionary<((int, int, int) R, int From, int To), Complex[]>();
        Complex[] Block((int, int, int) r, int from, int to)
        {
            if (!blocks.TryGetValue((r, from, to), out var b)) blocks[(r, from, to)] = b = new Complex[f * f];
            return b;
        }
        foreach (var o in model.Onsite)
        {
            var b = Block((0, 0, 0), o.Orbital, o.Orbital);
            for (int a = 0; a < f; a++) for (int c = 0; c < f; c++) b[a * f + c] += o.Amplitude[a, c];
        }
        foreach (var s in model.Shells)
        {
            var b = Block((0, 0, 0), s.Orbital, s.Orbital);
            for (int a = 0; a < f; a++) b[a * f + a] += s.Level;
        }
        foreach (var h in model.Hoppings)
        {
            var plus = Block(h.R, h.From, h.To);
            var minus = Block((-h.R.N1, -h.R.N2, -h.R.N3), h.To, h.From);
            for (int a = 0; a < f; a++)
                for (int c = 0; c < f; c++)
                {
                    plus[a * f + c] += h.Amplitude[a, c];
                    minus[c * f + a] += Complex.Conjugate(h.Amplitude[a, c]);
                }
        }
        var elements = new List<OneBodyElement>();
        foreach (var key in blocks.Keys.OrderBy(k => k.R.Item1).ThenBy(k => k.R.Item2).ThenBy(k => k.R.Item3).ThenBy(k => k.From).ThenBy(k => k.To))
        {
            var b = blocks[key];
            for (int a = 0; a < f; a++)
                for (int c = 0; c < f; c++)
                    if (b[a * f + c] != Complex.Zero) elements.Add(new(key.R, key.From, a, key.To, c, b[a * f + c], ""));
        }
        elements.Sort((x, y) =>
        {
            int c = x.Cell.CompareTo(y.Cell);
            if (c == 0) c = x.From.CompareTo(y.From);
            if (c == 0) c = x.FromFlavour.CompareTo(y.FromFlavour);
            if (c == 0) c = x.To.CompareTo(y.To);
            if (c == 0) c = x.ToFlavour.CompareTo(y.ToFlavour);
            return c;
        });
        return new OneBodyModel(header, elements);
    }

    /// <summary>The header of a bound model (used by the exporter).</summary>
    public static OneBodyHeader HeaderOf(BoundModel model, bool renormalized, double mu, string muRule, double temperature,
                                         int? mesh, bool shifted, string source) => new()
    {
        Model = model.Name, Renormalized = renormalized, Unit = model.Unit, Mu = mu, MuRule = muRule, Temperature = temperature,
        ElectronsPerCell = model.ElectronsPerCell, FormulaUnitsPerCell = model.FormulaUnitsPerCell, Lattice = model.Lattice,
        Flavours = OneBodyHeader.FlavourNames(model.Flavours), Sites = model.Sites,
        Orbitals = [.. model.Orbitals.Select(o => new OneBodyOrbital(o.Label(model.Sites), o.Site, o.Kind))],
        Mesh = mesh, Shifted = shifted, Source = source,
        ModelPath = string.IsNullOrEmpty(model.SourcePath) ? "" : Path.GetFullPath(model.SourcePath),
        ModelSha256 = Provenance.Hash(model.SourceText), ToolVersion = Provenance.ToolVersion, Created = Provenance.NowUtc(),
    };

    /// <summary>Relative size below which a Hermitian partner counts as equal (the files store shortest round-trip text).</summary>
    public const double HermiticityTolerance = 1e-12;

    /// <summary>Displacements must match R + tau_to - tau_from to this fraction of the lattice constant.</summary>
    public const double DisplacementTolerance = 1e-9;

    /// <summary>
    /// A plain one-body <see cref="BoundModel"/> (no correlated shell: levels are on-site terms; orbitals keep their
    /// kind, so correlated weights are still defined). <paramref name="text"/> is the file's text (its hash is the
    /// model hash of results made from it); <paramref name="displacements"/>, when the file has them, are checked
    /// against R + tau_to - tau_from.
    /// </summary>
    /// <exception cref="OneBodyModelError">Out-of-range values, a duplicated element, a missing or different Hermitian
    /// partner, or a displacement that does not match the cell and sites.</exception>
    public BoundModel Bind(string path, string text, IReadOnlyList<Vec3>? displacements = null)
    {
        var h = Header;
        int f = h.Flavours.Count, n = h.Orbitals.Count;
        double scale = 0;
        foreach (var e in Elements) scale = Math.Max(scale, Complex.Abs(e.Amplitude));
        double maxEnergy = PhysicalRange.MaxEnergy(h.Unit);
        var blocks = new Dictionary<((int, int, int) R, int From, int To), Complex[]>();
        var where = new Dictionary<((int, int, int), int, int, int, int), string>();
        for (int i = 0; i < Elements.Count; i++)
        {
            var e = Elements[i];
            if (!(Complex.Abs(e.Amplitude) <= maxEnergy))
                throw new OneBodyModelError(path, e.Where, "amplitude", $"{Complex.Abs(e.Amplitude).ToString("G6", CultureInfo.InvariantCulture)} {h.Unit.Symbol()} is beyond the physical range (at most {PhysicalRange.MaxEnergyText(h.Unit)})");
            if (Math.Abs(e.Cell.N1) > PhysicalRange.MaxBondCells || Math.Abs(e.Cell.N2) > PhysicalRange.MaxBondCells || Math.Abs(e.Cell.N3) > PhysicalRange.MaxBondCells)
                throw new OneBodyModelError(path, e.Where, "cell", $"({e.Cell.N1}, {e.Cell.N2}, {e.Cell.N3}) reaches beyond {PhysicalRange.MaxBondCells} cells");
            var key = (e.Cell, e.From, e.FromFlavour, e.To, e.ToFlavour);
            if (where.TryGetValue(key, out var first))
                throw new OneBodyModelError(path, e.Where, "element", $"{Describe(e)} is listed twice (first at {first})");
            where[key] = e.Where;
            if (!blocks.TryGetValue((e.Cell, e.From, e.To), out var b)) blocks[(e.Cell, e.From, e.To)] = b = new Complex[f * f];
            b[e.FromFlavour * f + e.ToFlavour] = e.Amplitude;
            if (displacements is not null)
            {
                var d = h.Lattice.LatticeVector(e.Cell.N1, e.Cell.N2, e.Cell.N3) + h.Sites[h.Orbitals[e.To].Site].Position - h.Sites[h.Orbitals[e.From].Site].Position;
                if ((displacements[i] - d).Norm > DisplacementTolerance * h.Lattice.Constant)
                    throw new OneBodyModelError(path, e.Where, "displacement", string.Create(CultureInfo.InvariantCulture,
                        $"({displacements[i].X:G6}, {displacements[i].Y:G6}, {displacements[i].Z:G6}) angstrom is not R + tau_to - tau_from = ({d.X:G6}, {d.Y:G6}, {d.Z:G6}) for cell ({e.Cell.N1}, {e.Cell.N2}, {e.Cell.N3})"));
            }
        }
        // Every element needs its Hermitian partner <to, -R | H | from, 0> = conj(t).
        foreach (var e in Elements)
        {
            var minus = (-e.Cell.N1, -e.Cell.N2, -e.Cell.N3);
            var partner = blocks.TryGetValue((minus, e.To, e.From), out var pb) ? pb[e.ToFlavour * f + e.FromFlavour] : Complex.Zero;
            if (Complex.Abs(partner - Complex.Conjugate(e.Amplitude)) > HermiticityTolerance * scale)
                throw new OneBodyModelError(path, e.Where, "amplitude", $"{Describe(e)} = {Text(e.Amplitude)} needs its Hermitian partner "
                    + $"(cell ({minus.Item1}, {minus.Item2}, {minus.Item3}), {h.Orbitals[e.To].Label} {h.Flavours[e.ToFlavour]} -> {h.Orbitals[e.From].Label} {h.Flavours[e.FromFlavour]}) = {Text(Complex.Conjugate(e.Amplitude))}, "
                    + (where.TryGetValue((minus, e.To, e.ToFlavour, e.From, e.FromFlavour), out var pw) ? $"found {Text(partner)} at {pw}" : "which is not listed"));
        }
        var onsite = new List<OnsiteTerm>();
        var hoppings = new List<Hopping>();
        foreach (var ((r, from, to), b) in blocks.OrderBy(kv => kv.Key.R).ThenBy(kv => kv.Key.From).ThenBy(kv => kv.Key.To))
        {
            var m = new FlavourMatrix(f, b);
            if (r == (0, 0, 0) && from == to) onsite.Add(new OnsiteTerm(from, m, $"{path}: on-site {h.Orbitals[from].Label}"));
            else if (from < to || (from == to && r.CompareTo((0, 0, 0)) > 0))
                hoppings.Add(new Hopping(from, to, r, m, $"{path}: {h.Orbitals[from].Label} -> {h.Orbitals[to].Label} cell ({r.Item1}, {r.Item2}, {r.Item3})"));
            // The other direction is the implied Hermitian conjugate, checked above.
        }
        return new BoundModel
        {
            Name = h.Model, Lattice = h.Lattice, Flavours = f, Sites = h.Sites,
            Orbitals = [.. h.Orbitals.Select(o => new Orbital(o.Name, o.Site, o.Kind))],
            Shells = [], Hoppings = hoppings, Onsite = onsite, ElectronsPerCell = h.ElectronsPerCell, Unit = h.Unit,
            FormulaUnitsPerCell = h.FormulaUnitsPerCell, SourceText = text, SourcePath = path,
        };
    }

    private string Describe(OneBodyElement e) =>
        $"cell ({e.Cell.N1}, {e.Cell.N2}, {e.Cell.N3}), {Header.Orbitals[e.From].Label} {Header.Flavours[e.FromFlavour]} -> {Header.Orbitals[e.To].Label} {Header.Flavours[e.ToFlavour]}";

    private static string Text(Complex z) => string.Create(CultureInfo.InvariantCulture, $"{z.Real:G10}{(z.Imaginary < 0 ? "-" : "+")}{Math.Abs(z.Imaginary):G10}i");
}
