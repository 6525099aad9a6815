using System.CommandLine;
using System.Globalization;
using Meanfield.Benchmarks;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>
/// `meanfield bench [MODEL] [--meshes 24,36,48] [--process-runs 9] [--scan [--scan-file F] [--scan-size N] [--scan-mesh M]]`:
/// full solves and their digest per mesh against the floor of a bare diagonalisation pass, `solve` at the largest mesh
/// timed as a fresh process, finite against infinite U, and optionally a shipped scan resampled to N x N points (timed,
/// with the time of a 32 x 32 grid extrapolated).
/// </summary>
public static class BenchCommand
{
    public static Command Build()
    {
        var model = new Argument<string>("MODEL") { Description = "Model file (default models/weyl-diamond.toml)", DefaultValueFactory = _ => "models/weyl-diamond.toml" };
        var meshes = new Option<string>("--meshes") { Description = "Comma-separated mesh divisions for the solve benchmark", DefaultValueFactory = _ => "24,36,48" };
        var temperature = CommonOptions.Temperature();
        var scan = new Option<bool>("--scan") { Description = "Also run a scan with node and DOS columns" };
        var file = new Option<string>("--scan-file") { Description = "Scan file resampled for the benchmark", DefaultValueFactory = _ => ScanBenchmark.DefaultScanFile };
        var size = new Option<int>("--scan-size") { Description = "Points per scan axis (a smaller grid is timed and extrapolated to 32 x 32)", DefaultValueFactory = _ => 32 };
        var scanMesh = new Option<int>("--scan-mesh") { Description = "Mesh of the benchmark scan", DefaultValueFactory = _ => 24 };
        var cold = new Option<int>("--cold-subset") { Description = "Scan points re-solved from a cold start for comparison", DefaultValueFactory = _ => 16 };
        var skipSolve = new Option<bool>("--no-solve") { Description = "Skip the per-mesh solve benchmark" };
        var runs = new Option<int>("--process-runs") { Description = "Times `solve` at the largest mesh as a fresh process this many times (start-up and JIT included); 0 skips it", DefaultValueFactory = _ => 9 };
        var finiteU = new Option<string?>("--finite-u") { Description = "U of the finite-U against infinite-U comparison per mesh (default: the model's U, else 4 x its largest energy); \"off\" skips it" };
        var command = new Command("bench", "Measure solver speed: solves and digests per mesh against a bare diagonalisation pass, finite against infinite U, and a scan")
        {
            model, meshes, temperature, scan, file, size, scanMesh, cold, skipSolve, runs, finiteU,
        };
        command.SetAction(async (parse, ct) =>
        {
            var o = parse.InvocationConfiguration.Output;
            string Line(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
            var bound = CommonOptions.LoadModel(parse.GetValue(model)!, null);
            var settings = CommonOptions.Settings(bound, parse.GetValue(temperature), null);
            o.WriteLine($"model {bound.Name} ({parse.GetValue(model)}), {bound.BasisSize} bands, T = {settings.Temperature * bound.Unit.Kelvins():G4} K, {Environment.ProcessorCount} cores, eigensolver: {Numerics.Eigensolvers.Description}");
            if (!parse.GetValue(skipSolve))
            {
                var list = parse.GetValue(meshes)!.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries)
                    .Select(p => int.TryParse(p, NumberStyles.None, CultureInfo.InvariantCulture, out int m) && m >= 2 ? m
                        : throw new UserInputException($"--meshes '{parse.GetValue(meshes)}': '{p}' is not a mesh size >= 2")).ToList();
                o.WriteLine("solve: saddle point only; digest: solution handle + spectrum digest as `solve` prints it; pass: one solver pass on the wedge; bare full/wedge: assemble + diagonalise only; jac: analytic Jacobian");
                o.WriteLine($"{"mesh",5} {"k-points",9} {"wedge",7} {"factor",6} {"group",5} {"solve s",8} {"cpu s",6} {"iter",4} {"fine",4} {"coarse",6} {"digest s",8} {"pass s",8} {"bare full",9} {"bare wedge",10} {"pass/bare",9} {"jac s",7} {"bytes/pass",10} {"peak MB",7} phase");
                foreach (int m in list)
                {
                    var r = SolveBenchmark.Run(bound, settings with { Mesh = m }, ct);
                    o.WriteLine(Line($"{r.Mesh,5} {r.KPoints,9} {r.WedgePoints,7} {r.ReductionFactor,6:F2} {r.SymmetryOrder,5} {r.SolveSeconds,8:F3} {r.SolveCpuSeconds,6:F2} {r.Iterations,4} {r.ZonePasses,4} {r.CoarsePasses,6} {r.DigestSeconds,8:F3} {r.PassSeconds,8:F4} {r.BarePassSeconds,9:F4} {r.BareWedgeSeconds,10:F4} {r.PassSeconds / r.BareWedgeSeconds,9:F2} {r.JacobianSeconds,7:F4} {r.BytesPerPass,10} {r.PeakWorkingSetBytes / 1048576.0,7:F0} {(r.Converged ? r.Phase ?? "-" : "NOT CONVERGED")}"));
                }
                int count = parse.GetValue(runs) is var c and >= 0 and <= 1000 ? c : throw new UserInputException($"--process-runs {parse.GetValue(runs)}: give a count from 0 to 1000");
                if (count > 0)
                    o.WriteLine(SelfCommand.TimeSolve(parse.GetValue(model)!, list.Max(), parse.GetValue(temperature), count, ct).Describe());
                if (parse.GetValue(finiteU) is not "off" and var uText)
                {
                    double? u = uText is null ? null : CommonOptions.ParseEnergy(uText, bound.Unit, "--finite-u");
                    o.WriteLine("finite U against infinite U, same lattice and mesh (passes: fine + coarse/8):");
                    foreach (int m in list) o.WriteLine(SolveBenchmark.CompareFiniteU(bound, settings with { Mesh = m }, u, ct).Describe(bound.Unit.Symbol()));
                }
            }
            if (parse.GetValue(scan))
            {
                int n = parse.GetValue(size);
                var definition = ScanBenchmark.Resampled(parse.GetValue(file)!, n, parse.GetValue(scanMesh));
                o.WriteLine($"scan: {parse.GetValue(file)} resampled to {n} x {n} points, mesh {parse.GetValue(scanMesh)}, node and DOS columns, cold subset {parse.GetValue(cold)} ...");
                var r = await ScanBenchmark.RunAsync(definition, parse.GetValue(cold), null, ct);
                foreach (var line in r.Describe()) o.WriteLine(line);
            }
            return ExitCodes.Success;
        });
        return command;
    }
}
