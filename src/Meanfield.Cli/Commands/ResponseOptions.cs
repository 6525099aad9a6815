using System.CommandLine;
using System.Globalization;
using Meanfield.Analysis.Responses;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>Options the `hall` and `dipole` commands share: the mu window, the temperatures and the response mesh.</summary>
internal sealed class ResponseOptions
{
    /// <summary>--window MU1 MU2 (relative to mu0).</summary>
    public Option<string[]> Window { get; } = CommonOptions.Window(
        "Chemical potentials MU1 MU2 relative to the solution's mu (-2 2, or -2meV 2meV; bare numbers in the model's energy unit)", required: true);
    /// <summary>--mu-points: mu values in the window.</summary>
    public Option<int> Points { get; } = new("--mu-points") { Description = "Chemical potentials in the window (2..2001)", DefaultValueFactory = _ => 121 };
    /// <summary>--temperatures: comma-separated list.</summary>
    public Option<string> Temperatures { get; }
    /// <summary>--kmesh: response mesh divisions.</summary>
    public Option<int> KMesh { get; } = new("--kmesh") { Description = "Response k-mesh divisions per reciprocal axis (shifted; 2..256)", DefaultValueFactory = _ => 24 };
    /// <summary>--refine: adaptive refinement levels.</summary>
    public Option<int> Refine { get; } = new("--refine") { Description = "Adaptive refinement levels around curvature spikes (0..4; each splits a cell in 3 per axis)", DefaultValueFactory = _ => 0 };

    /// <summary>Options with the given default temperature list.</summary>
    public ResponseOptions(string defaultTemperatures) => Temperatures = new("--temperatures")
    {
        Description = $"Comma-separated temperatures of the Fermi function: 2K, 0.3meV or bare numbers in the energy unit (default {defaultTemperatures})",
        DefaultValueFactory = _ => defaultTemperatures,
    };

    /// <summary>Adds the options to a command.</summary>
    public void AddTo(Command c) { c.Add(Window); c.Add(Points); c.Add(Temperatures); c.Add(KMesh); c.Add(Refine); }

    /// <summary>mu grid, temperatures (energy unit) and mesh, checked.</summary>
    public (double[] Mu, double[] T, ResponseMesh Mesh) Parse(ParseResult parse, double mu0, EnergyUnit unit, bool positiveTemperature)
    {
        var (lo, hi) = CommonOptions.ParseWindow(parse.GetValue(Window), unit)
                       ?? throw new UserInputException("--window: give two chemical potentials MU1 < MU2 relative to mu");
        int n = parse.GetValue(Points);
        if (n is < 2 or > 2001) throw new UserInputException($"--mu-points {n}: use 2..2001");
        var mu = Enumerable.Range(0, n).Select(i => mu0 + lo + (hi - lo) * i / (n - 1)).ToArray();
        var t = parse.GetValue(Temperatures)!.Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries)
            .Select(s => CommonOptions.ParseTemperature(s, unit, "--temperatures")).ToArray();
        if (t.Length == 0 || t.Length > 8) throw new UserInputException("--temperatures: give 1..8 temperatures");
        if (positiveTemperature && t.Any(x => x <= 0))
            throw new UserInputException("--temperatures: the dipole is a Fermi-surface integral; every temperature must be > 0 (and above the mesh's level spacing)");
        double tMax = t.Max();
        var mesh = new ResponseMesh
        {
            Divisions = parse.GetValue(KMesh), RefinementLevels = parse.GetValue(Refine),
            ThermalWidth = t.Any(x => x > 0) ? t.Where(x => x > 0).Min() : null,
            RefinementWindow = (mu[0] - 10 * tMax - 1e-9 * Math.Abs(mu0), mu[^1] + 10 * tMax + 1e-9 * Math.Abs(mu0)),
        };
        mesh.Validate();
        return (mu, t, mesh);
    }

    /// <summary>Five significant digits, invariant culture.</summary>
    public static string Format(double v) => v.ToString("G5", CultureInfo.InvariantCulture);
}
