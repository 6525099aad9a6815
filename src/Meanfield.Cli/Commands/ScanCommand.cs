using System.Collections;
using System.CommandLine;
using System.Globalization;
using Meanfield.Models;
using Meanfield.Scans;
using Meanfield.Units;
using Spectre.Console;

namespace Meanfield.Cli.Commands;

/// <summary>What the scan command reads from outside the command line; tests replace it.</summary>
/// <param name="Environment">Environment variables (Slurm array variables are read from here).</param>
/// <param name="Cancellation">Extra cancellation besides Ctrl-C.</param>
/// <param name="OnProgress">Called on every finished point (after the display is updated).</param>
public sealed record ScanCommandContext(Func<IDictionary> Environment, CancellationToken Cancellation = default,
                                        Action<ScanProgress>? OnProgress = null)
{
    public static ScanCommandContext Process => new(System.Environment.GetEnvironmentVariables);
}

/// <summary>
/// `meanfield scan SCAN --out FILE.parquet [--resume] [--shard I/N] [--jobs N]` solves the mean field on every point of
/// a scan file; `meanfield scan merge DIR|FILES --out FILE` joins the shard files of a cluster run.
/// </summary>
public static class ScanCommand
{
    /// <summary>Exit code after Ctrl-C (128 + SIGINT, the shell convention).</summary>
    public const int Interrupted = 130;

    public static Command Build() => Build(ScanCommandContext.Process);

    public static Command Build(ScanCommandContext context)
    {
        var scanFile = new Argument<string>("SCAN") { Description = "Scan file (.toml)" };
        var output = new Option<string>("--out", "-o") { Description = "Result file (.parquet); a shard writes NAME.shard-III-of-NNN.parquet", Required = true };
        var resume = new Option<bool>("--resume") { Description = "Continue an interrupted run from its chunk files (OUT.parts/)" };
        var shard = new Option<string?>("--shard") { Description = "Compute shard I of N (0 <= I < N), e.g. 3/16; default: from SLURM_ARRAY_TASK_* inside a job array, else the whole grid" };
        var jobs = new Option<int>("--jobs", "-j") { Description = "Snake segments solved at once (default 1: the solver already uses every core over k)", DefaultValueFactory = _ => 1 };
        var flush = new Option<int>("--checkpoint-every") { Description = "Write finished points to disk after this many (default 16; also every 30 s)", DefaultValueFactory = _ => 16 };
        var command = new Command("scan", "Solve the mean field on every point of a scan grid and write one Parquet row per point")
        {
            scanFile, output, resume, shard, jobs, flush, BuildMerge(),
        };
        command.SetAction(async (parse, ct) =>
        {
            var o = parse.InvocationConfiguration.Output;
            var e = parse.InvocationConfiguration.Error;
            using var linked = CancellationTokenSource.CreateLinkedTokenSource(ct, context.Cancellation);
            try
            {
                return await RunAsync(parse.GetValue(scanFile)!, parse.GetValue(output)!, parse.GetValue(resume),
                                      parse.GetValue(shard), parse.GetValue(jobs), parse.GetValue(flush), context, o, e, linked.Token);
            }
            catch (ScanError err) { e.WriteLine($"error: {err.Message}"); return ExitCodes.BadInput; }
            catch (OperationCanceledException) when (linked.IsCancellationRequested)
            {
                e.WriteLine("interrupted: finished points are kept in the chunk directory; rerun the same command with --resume to continue");
                return Interrupted;
            }
        });
        return command;
    }

    private static async Task<int> RunAsync(string scanPath, string outPath, bool resume, string? shardText, int jobs, int flushEvery,
                                            ScanCommandContext context, TextWriter o, TextWriter e, CancellationToken ct)
    {
        if (jobs < 1) throw new UserInputException($"--jobs {jobs}: need at least 1");
        if (flushEvery < 1) throw new UserInputException($"--checkpoint-every {flushEvery}: need at least 1");
        var shard = shardText is not null ? ShardSpec.Parse(shardText) : ShardSpec.FromEnvironment(context.Environment()) ?? ShardSpec.Whole;
        if (!File.Exists(scanPath)) throw new UserInputException($"{scanPath}: scan file not found");
        var first = ScanFileReader.Load(scanPath);
        var spec = ModelFile.Load(first.ModelPath);
        var scan = ScanFileReader.Load(scanPath, spec.Parameters.Select(p => p.Name).ToList());
        var grid = scan.ToGrid();
        shard.CheckHasPoints(grid.Count);
        var solver = SaddlePointPointSolver.For(scan);
        var target = shard.OutputPath(outPath);
        Output.OutputGuard.Check(target, [scanPath, first.ModelPath]);
        var outputFile = new ScanOutput(target, scan.Provenance(spec.Header.Unit.Symbol()));
        var gate = new Lock();
        var options = new ScanRunOptions
        {
            Shard = shard, Resume = resume, DegreeOfParallelism = jobs, FlushEveryPoints = flushEvery,
            Notice = m => { lock (gate) e.WriteLine($"note: {m}"); },
        };
        int points = grid.Shard(shard).Count;
        string part = shard.IsWhole ? "" : $" (shard {shard} of a {grid.Count}-point grid)";
        o.WriteLine($"scan {Path.GetFileName(scanPath)}: {points} points{part}, mesh {scan.Solver.Mesh}, model {Path.GetFileName(scan.ModelPath)} -> {target}");

        ScanSummary summary;
        bool terminal = ReferenceEquals(o, Console.Out) && !Console.IsOutputRedirected;
        if (terminal)
            summary = await AnsiConsole.Progress()
                .Columns(new TaskDescriptionColumn(), new ProgressBarColumn(), new PercentageColumn(),
                         new ElapsedTimeColumn(), new RemainingTimeColumn(), new SpinnerColumn())
                .StartAsync(async display =>
                {
                    var task = display.AddTask("solving", maxValue: points);
                    var progress = new Reporter(p =>
                    {
                        task.Value = p.Done;
                        task.Description = p.NonConverged > 0 ? $"solving ({p.NonConverged} not converged)" : "solving";
                        context.OnProgress?.Invoke(p);
                    });
                    return await ScanRunner.RunAsync(grid, solver.Delegate, outputFile, options, progress, ct);
                });
        else
        {
            var lines = new PlainProgress(o, TimeSpan.FromSeconds(5), context.OnProgress);
            summary = await ScanRunner.RunAsync(grid, solver.Delegate, outputFile, options, lines, ct);
        }
        o.WriteLine(await SummaryLineAsync(summary));
        return ExitCodes.Success;
    }

    /// <summary>points, converged, not converged, wall time, mean iterations, warm-start share.</summary>
    private static async Task<string> SummaryLineAsync(ScanSummary s)
    {
        var table = await ScanParquet.ReadAsync(s.OutputPath);
        var solved = table.Rows;
        double meanIterations = solved.Count == 0 ? 0 : solved.Average(r => r.Result.Iterations);
        double warm = solved.Count == 0 ? 0 : solved.Count(r => r.WarmStarted) / (double)solved.Count;
        string resumed = s.Resumed > 0 ? $" ({s.Resumed} from an earlier run)" : "";
        string bad = s.NonConverged > 0 ? $"{s.NonConverged} NOT converged (kept, flagged converged = false)" : "0 not converged";
        if (s.Failed > 0) bad += $", of which {s.Failed} failed with an error (see the error column)";
        return string.Create(CultureInfo.InvariantCulture,
            $"done: {s.Total} points{resumed}, {s.Total - s.NonConverged} converged, {bad}; wall {s.Elapsed.TotalSeconds:F1} s; mean iterations {meanIterations:F1}; warm-started {100 * warm:F0}%; wrote {s.OutputPath}");
    }

    private static Command BuildMerge()
    {
        var inputs = new Argument<string[]>("INPUTS") { Description = "A directory of shard files (*.shard-*-of-*.parquet) or the shard files themselves", Arity = ArgumentArity.OneOrMore };
        var output = new Option<string>("--out", "-o") { Description = "Merged result file (.parquet)", Required = true };
        var allow = new Option<bool>("--allow-incomplete") { Description = "Write the merged file even when points are missing (never with duplicates)" };
        var merge = new Command("merge", "Merge the shard files of one scan, checking that every point is there exactly once") { inputs, output, allow };
        merge.SetAction(async (parse, ct) =>
        {
            var o = parse.InvocationConfiguration.Output;
            var e = parse.InvocationConfiguration.Error;
            try
            {
                var given = parse.GetValue(inputs)!;
                var files = new List<string>();
                foreach (var g in given)
                {
                    if (Directory.Exists(g)) files.AddRange(ScanMerge.ShardFiles(g));
                    else if (File.Exists(g)) files.Add(g);
                    else throw new UserInputException($"{g}: no such file or directory");
                }
                if (files.Count == 0) throw new UserInputException($"no shard files (*.shard-*-of-*.parquet) in {string.Join(", ", given)}");
                Output.OutputGuard.Check(parse.GetValue(output)!, files);
                var report = await ScanMerge.MergeAsync(files, parse.GetValue(output)!, parse.GetValue(allow), ct);
                (report.Complete ? o : e).WriteLine(report.ToString());
                if (!report.Written) return ExitCodes.NoAnswer;
                o.WriteLine($"wrote {Path.GetFullPath(parse.GetValue(output)!)}" + (report.Complete ? "" : " (incomplete: --allow-incomplete)"));
                return ExitCodes.Success;
            }
            catch (ScanError err) { e.WriteLine($"error: {err.Message}"); return ExitCodes.BadInput; }
        });
        return merge;
    }

    private sealed class Reporter(Action<ScanProgress> report) : IProgress<ScanProgress>
    {
        public void Report(ScanProgress value) => report(value);
    }

    /// <summary>One plain line every few seconds, for logs (no escape codes).</summary>
    private sealed class PlainProgress(TextWriter o, TimeSpan every, Action<ScanProgress>? hook) : IProgress<ScanProgress>
    {
        private readonly Lock _gate = new();
        private DateTime _last = DateTime.UtcNow;

        public void Report(ScanProgress p)
        {
            lock (_gate)
            {
                if (DateTime.UtcNow - _last >= every && p.Done < p.Total)
                {
                    _last = DateTime.UtcNow;
                    string eta = p.Remaining is { } r ? $", about {Clock(r)} left" : "";
                    o.WriteLine(string.Create(CultureInfo.InvariantCulture,
                        $"  {p.Done}/{p.Total} points ({100 * p.Fraction:F0}%), {p.NonConverged} not converged, {Clock(p.Elapsed)} elapsed{eta}"));
                }
            }
            hook?.Invoke(p);
        }

        private static string Clock(TimeSpan t) => t.TotalHours >= 1 ? t.ToString(@"h\:mm\:ss", CultureInfo.InvariantCulture) : t.ToString(@"m\:ss", CultureInfo.InvariantCulture);
    }
}
