using System.CommandLine;
using System.Globalization;
using Meanfield.Benchmarks;
using Meanfield.Models;
using Meanfield.Scans;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>
/// `meanfield bench [MODEL] [--meshes 24,36,48] [--scan] [--scan-size N]`: times full solves against the floor of a bare
/// diagonalisation pass, and optionally a V x (m/lso) scan with warm against cold starts.
/// </summary>
public static class BenchCommand
{
    public static Command Build()
    {
        var model = new Argument<string>("MODEL") { Description = "Model file (default models/weyl-diamond.toml)", DefaultValueFactory = _ => "models/weyl-diamond.toml" };
        var meshes = new Option<string>("--meshes") { Description = "Comma-separated mesh divisions for the solve benchmark", DefaultValueFactory = _ => "24,36,48" };
        var temperature = CommonOptions.Temperature();
        var scan = new Option<bool>("--scan") { Description = "Also run a V x (m/lso) scan of the model (parameters V, m, lso)" };
        var size = new Option<int>("--scan-size") { Description = "Points per scan axis", DefaultValueFactory = _ => 32 };
        var scanMesh = new Option<int>("--scan-mesh") { Description = "Mesh of the benchmark scan", DefaultValueFactory = _ => 24 };
        var cold = new Option<int>("--cold-subset") { Description = "Scan points re-solved from a cold start for comparison", DefaultValueFactory = _ => 16 };
        var skipSolve = new Option<bool>("--no-solve") { Description = "Skip the per-mesh solve benchmark" };
        var finiteU = new Option<string?>("--finite-u") { Description = "U of the finite-U against infinite-U comparison per mesh (default: the model's U, else 4 x its largest energy); \"off\" skips it" };
        var command = new Command("bench", "Measure solver speed: full solves per mesh against a bare diagonalisation pass, and a scan")
        {
            model, meshes, temperature, scan, size, scanMesh, cold, skipSolve, finiteU,
        };
        command.SetAction(async (parse, ct) =>
        {
            var o = parse.InvocationConfiguration.Output;
            var path = parse.GetValue(model)!;
            var bound = CommonOptions.LoadModel(path, null);
            var settings = CommonOptions.Settings(bound, parse.GetValue(temperature), null);
            o.WriteLine($"model {bound.Name} ({path}), {bound.BasisSize} bands, T = {settings.Temperature * bound.Unit.Kelvins():G4} K, {Environment.ProcessorCount} cores, eigensolver: {Numerics.Eigensolvers.Description}");
            if (!parse.GetValue(skipSolve))
            {
                var list = ParseMeshes(parse.GetValue(meshes)!);
                o.WriteLine("pass: one solver pass on the wedge; bare full/wedge: assemble + diagonalise only, on every k / on the wedge; jac: analytic Jacobian from the kept eigenvectors");
                o.WriteLine($"{"mesh",5} {"k-points",9} {"wedge",7} {"factor",6} {"group",5} {"solve s",8} {"cpu s",6} {"iter",4} {"fine",4} {"coarse",6} {"pass s",8} {"bare full",9} {"bare wedge",10} {"pass/bare",9} {"jac s",7} {"bytes/pass",10} {"peak MB",7} conv");
                var rows = new List<string>();
                foreach (int m in list)
                {
                    var r = SolveBenchmark.Run(bound, settings with { Mesh = m }, ct);
                    rows.Add(string.Create(CultureInfo.InvariantCulture,
                        $"{r.Mesh,5} {r.KPoints,9} {r.WedgePoints,7} {r.ReductionFactor,6:F2} {r.SymmetryOrder,5} {r.SolveSeconds,8:F3} {r.SolveCpuSeconds,6:F2} {r.Iterations,4} {r.ZonePasses,4} {r.CoarsePasses,6} {r.PassSeconds,8:F4} {r.BarePassSeconds,9:F4} {r.BareWedgeSeconds,10:F4} {r.PassSeconds / r.BareWedgeSeconds,9:F2} {r.JacobianSeconds,7:F4} {r.BytesPerPass,10} {r.PeakWorkingSetBytes / 1048576.0,7:F0} {(r.Converged ? "yes" : "NO")}"));
                    o.WriteLine(rows[^1]);
                }
                var uText = parse.GetValue(finiteU);
                if (uText != "off")
                {
                    double? u = uText is null ? null : CommonOptions.ParseEnergy(uText, bound.Unit, "--finite-u");
                    if (u is < 0) throw new UserInputException($"--finite-u '{uText}': U must be >= 0");
                    o.WriteLine("finite U against infinite U, same lattice and mesh (passes: fine + coarse/8):");
                    foreach (int m in list)
                    {
                        FiniteUComparison c;
                        try { c = SolveBenchmark.CompareFiniteU(bound, settings with { Mesh = m }, u, ct); }
                        catch (ArgumentException e)
                        {
                            o.WriteLine($"  not compared: {e.Message}");
                            break;
                        }
                        o.WriteLine(string.Create(CultureInfo.InvariantCulture,
                            $"{c.Mesh,5}  U = {c.U:G6} {bound.Unit.Symbol()}: finite {c.FiniteSeconds:F3} s ({c.FiniteCpuSeconds:F2} cpu s, {c.FiniteIterations} iter, {c.FinitePasses} passes{(c.FiniteConverged ? "" : ", NOT converged")}), infinite {c.InfiniteSeconds:F3} s ({c.InfiniteCpuSeconds:F2} cpu s, {c.InfiniteIterations} iter, {c.InfinitePasses} passes{(c.InfiniteConverged ? "" : ", NOT converged")}); ratio {c.Ratio:F2} wall, {c.CpuRatio:F2} cpu"));
                    }
                }
            }
            if (parse.GetValue(scan))
            {
                int n = parse.GetValue(size);
                if (n < 2) throw new UserInputException($"--scan-size {n}: need at least 2");
                var definition = BenchScan(path, n, parse.GetValue(scanMesh));
                var grid = definition.ToGrid();
                o.WriteLine($"scan: {n} x {n} points (V x m/lso), mesh {parse.GetValue(scanMesh)}, cold subset {parse.GetValue(cold)} ...");
                var r = await ScanBenchmark.RunAsync(definition, grid, parse.GetValue(cold), null, ct);
                o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  points                       {r.Points} ({r.NonConverged} not converged)"));
                o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  wall time                    {r.WallSeconds:F1} s ({r.WallSeconds / r.Points:F3} s per point, {r.ZonePasses} zone passes)"));
                o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  diagonalisation share        {100 * r.DiagonalisationFraction:F0}% of wall x cores"));
                o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  mean iterations (warm)       {r.MeanIterationsWarm:F2} over the {100 * r.WarmShare:F0}% warm-started points"));
                o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  subset of {r.ColdSubset}: in scan       {r.MeanIterationsWarmSubset:F2} iterations; cold {r.MeanIterationsColdSubset:F2} iterations ({r.ColdSubsetSeconds:F1} s)"));
            }
            return ExitCodes.Success;
        });
        return command;
    }

    private static int[] ParseMeshes(string text)
    {
        var parts = text.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        var list = new List<int>();
        foreach (var p in parts)
            if (int.TryParse(p, NumberStyles.None, CultureInfo.InvariantCulture, out int m) && m >= 2) list.Add(m);
            else throw new UserInputException($"--meshes '{text}': '{p}' is not a mesh size >= 2");
        return [.. list];
    }

    /// <summary>The benchmark scan: V against m/lso as in scans/weyl-diamond-v-ratio.toml, n x n points.</summary>
    private static ScanDefinition BenchScan(string modelPath, int n, int mesh)
    {
        var full = Path.GetFullPath(modelPath);
        var spec = ModelFile.Load(full);
        string text = string.Create(CultureInfo.InvariantCulture, $"""
            model = "{Path.GetFileName(full)}"
            temperature = "2 K"
            [[axis]]
            name = "V"
            from = {BenchRange.VFrom}
            to = {BenchRange.VTo}
            points = {n}
            [[axis]]
            name = "ratio"
            free = true
            from = {BenchRange.RatioFrom}
            to = {BenchRange.RatioTo}
            points = {n}
            [tie]
            m = "ratio * lso"
            [solver]
            mesh = {mesh}
            """);
        return ScanFileReader.Parse(text, Path.Combine(Path.GetDirectoryName(full)!, "bench-scan.toml"), spec.Parameters.Select(p => p.Name).ToList());
    }

    /// <summary>Axis ranges of the benchmark scan (those of the shipped diamond scan).</summary>
    private static class BenchRange
    {
        public const double VFrom = 240, VTo = 320, RatioFrom = 0, RatioTo = 3;
    }
}
