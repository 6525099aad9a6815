using System.Globalization;
using System.Text.Json;
using Meanfield.Cli;
using Meanfield.Renormalization;
using Meanfield.Solutions;
using Meanfield.Tests.Cli;

namespace Meanfield.Tests.FiniteU;

/// <summary>
/// A finite-U solution through the solution file and a downstream command: the file carries U and the bosons, reading
/// it back gives the same amplitudes and mu, and the bands of the file are the two-level heavy bands of the
/// four-boson renormalization.
/// </summary>
public class FiniteUSolutionTests
{
    // One conduction band (nearest-neighbour hopping -t on a simple-cubic lattice) and one f doublet with on-site V.
    private const string Toml = """
        # Test lattice (invented numbers): simple-cubic Anderson lattice at finite U.
        [model]
        name = "Finite-U test lattice"
        energy_unit = "meV"
        electrons_per_cell = 2.4
        flavours = 2

        [parameters]
        t = 100
        V = 150
        ef = -250
        U = 600

        [lattice]
        kind = "simple-cubic"
        constant = 4.1

        [[site]]
        name = "Va"
        position = [0, 0, 0]
        orbitals = ["d"]
        [site.shell]
        name = "f"
        level = "ef"
        U = "U"

        [[hopping]]
        from = "Va:d"
        to = "Va:d"
        neighbour = 1
        amplitude = "-t"

        [[hybridization]]
        from = "Va:d"
        to = "Va:f"
        amplitude = "V"
        """;

    private const double T = 100, V = 150, Ef = -250;

    // The model file above solved once on a 6^3 mesh at 2 K into a fresh folder: (folder, model file, solution file).
    private static (string Dir, string Model, string Json) Solved()
    {
        var dir = CliRun.TempDir();
        var model = Path.Combine(dir, "model.toml");
        File.WriteAllText(model, Toml);
        var json = Path.Combine(dir, "s.json");
        var (code, stdout, err) = CliRun.Run("solve", model, "--mesh", "6", "-T", "2K", "--out", json);
        Assert.True(code == ExitCodes.Success, err + stdout);
        return (dir, model, json);
    }

    [Fact]
    public void Solution_file_round_trip_and_bands_of_the_file()
    {
        var (dir, model, json) = Solved();
        int code; string stdout, err;

        using (var doc = JsonDocument.Parse(File.ReadAllText(json)))
        {
            var site = doc.RootElement.GetProperty("sites")[0];
            Assert.Equal(600, site.GetProperty("u").GetDouble());
            double e = site.GetProperty("e").GetDouble(), p = site.GetProperty("p").GetDouble(), d = site.GetProperty("d").GetDouble();
            double r = site.GetProperty("r").GetDouble(), nf = site.GetProperty("n_f").GetDouble();
            // Kotliar & Ruckenstein, PRL 57, 1362 (1986), Eqs. 3-5 (paramagnetic): completeness, the f filling and q.
            Assert.Equal(1.0, e * e + 2 * p * p + d * d, 12);
            Assert.Equal(nf, 2 * (p * p + d * d), 8);
            Assert.Equal(p * (e + d) / Math.Sqrt(nf / 2 * (1 - nf / 2)), r, 8);
        }

        // Reading back: the handle rebuilt from the file has the file's amplitudes and mu, and the file re-checks as a
        // saddle point of the model (one pass of the finite-U equations).
        var loaded = Solution.Load(json);
        var doc2 = Meanfield.Output.SolutionDocument.Load(json);
        Assert.Equal(doc2.Sites[0].R, loaded.Amplitudes!.R[0]);
        Assert.Equal(doc2.Sites[0].Lambda, loaded.Amplitudes!.Lambda[0]);
        Assert.Equal(doc2.Mu, loaded.Mu);

        // Downstream: the band structure of the file. At Gamma the conduction energy is -6t; with one orbital each the
        // heavy bands are the two-level eigenvalues (eps_c + eps_f')/2 -+ sqrt(((eps_c - eps_f')/2)^2 + (qV)^2),
        // eps_f' = eps_f + lambda (common practice: two coupled levels).
        var bands = Path.Combine(dir, "b.csv");
        (code, stdout, err) = CliRun.Run("bands", json, "--out", bands);
        Assert.True(code == ExitCodes.Success, err + stdout);
        double q = doc2.Sites[0].R, level = Ef + doc2.Sites[0].Lambda, ec = -6 * T;
        double mid = 0.5 * (ec + level), half = Math.Sqrt(0.25 * (ec - level) * (ec - level) + q * q * V * V);
        var gamma = File.ReadLines(bands).Where(l => !l.StartsWith('#')).Skip(1).Select(l => l.Split(','))
                        .Where(c => c[5] == "G").Select(c => double.Parse(c[7], CultureInfo.InvariantCulture)).Order().ToList();
        Assert.NotEmpty(gamma);
        Assert.Equal(mid - half, gamma.First(), 1e-6 * T);
        Assert.Equal(mid + half, gamma.Last(), 1e-6 * T);
    }

    /// <summary>
    /// The other readers of a solution on a finite-U one: DOS, export (whose correlated level must be eps_f + lambda and
    /// whose hybridization must be q V, the renormalization of Kotliar &amp; Ruckenstein Eq. 5) and the heat, which re-solves
    /// the finite-U saddle point at every temperature warm-started from the last.
    /// </summary>
    [Fact]
    public void Dos_export_and_heat_read_a_finite_U_solution()
    {
        var (dir, model, json) = Solved();
        int code; string stdout, err;
        var doc = Meanfield.Output.SolutionDocument.Load(json);
        (code, stdout, err) = CliRun.Run("dos", json, "--out", Path.Combine(dir, "d.csv"));
        Assert.True(code == ExitCodes.Success, err + stdout);
        var export = Path.Combine(dir, "m.json");
        (code, stdout, err) = CliRun.Run("export", json, "--out", export);
        Assert.True(code == ExitCodes.Success, err + stdout);
        var exported = Meanfield.Output.OneBodyModelFiles.Load(export).Model;
        var bare = new Meanfield.Bloch.BlochHamiltonian(exported);
        // At k = 0 the on-site block of the exported model: [[eps_c(0), qV], [qV, eps_f + lambda]] per spin.
        var h = new System.Numerics.Complex[bare.Size * bare.Size]; var scratch = new System.Numerics.Complex[bare.Size * bare.Size];
        bare.Assemble(Meanfield.Lattices.Vec3.Zero, h, scratch);
        int n = bare.Size, f = exported.Orbitals.Select((o, i) => (o, i)).First(x => x.o.Name == "f").i * exported.Flavours;
        int c = exported.Orbitals.Select((o, i) => (o, i)).First(x => x.o.Name == "d").i * exported.Flavours;
        Assert.Equal(Ef + doc.Sites[0].Lambda, h[f * n + f].Real, 1e-9 * T);
        Assert.Equal(doc.Sites[0].R * V, Math.Abs(h[c * n + f].Real), 1e-9 * T);
        (code, stdout, err) = CliRun.Run("heat", model, "--mesh", "6", "--tmin", "2K", "--tmax", "20K", "--out", Path.Combine(dir, "h.csv"));
        Assert.True(code == ExitCodes.Success, err + stdout);
    }

    [Fact]
    public void Kondo_scale_of_a_finite_U_model_is_refused_with_exit_two()
    {
        var dir = CliRun.TempDir();
        var model = Path.Combine(dir, "model.toml");
        File.WriteAllText(model, Toml);
        var (code, stdout, err) = CliRun.Run("kondo-scale", model);
        Assert.Equal(ExitCodes.BadInput, code);
        Assert.Contains("finite U", err + stdout);
    }

    /// <summary>The four-boson amplitudes the file carries are those the solver's q uses (Eq. 5 of Kotliar &amp; Ruckenstein).</summary>
    [Theory]
    [InlineData(0.3, 0.1)]
    [InlineData(0.05, 0.02)]
    public void Factor_with_slopes_matches_finite_differences(double e, double d)
    {
        var b = FourBosonAmplitudes.FromEmptyAndDouble(e, d)!.Value;
        var (q, qe, qd) = b.FactorWithSlopes();
        Assert.Equal(Math.Sqrt(b.Z), q, 12);
        const double h = 1e-6;
        double Q(double ee, double dd) => FourBosonAmplitudes.FromEmptyAndDouble(ee, dd)!.Value.FactorWithSlopes().Q;
        Assert.Equal((Q(e + h, d) - Q(e - h, d)) / (2 * h), qe, 1e-7);
        Assert.Equal((Q(e, d + h) - Q(e, d - h)) / (2 * h), qd, 1e-7);
    }
}
