using System.Collections;
using System.CommandLine;
using Meanfield.Scans;

namespace Meanfield.Cli.Commands;

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
            scanFile, output, resume, shard, jobs, flush, ScanMergeCommand.Build(),
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
        var job = ScanJob.Prepare(scanPath, outPath, shard);
        var gate = new Lock();
        var options = new ScanRunOptions
        {
            Resume = resume, DegreeOfParallelism = jobs, FlushEveryPoints = flushEvery,
            Notice = m => { lock (gate) e.WriteLine($"note: {m}"); },
        };
        o.WriteLine(job.Heading(scanPath));
        var summary = await Display.ScanProgressDisplay.RunAsync(o, job.Points, context.OnProgress, p => job.RunAsync(options, p, ct));
        o.WriteLine(await ScanJob.DescribeAsync(summary, ct));
        return ExitCodes.Success;
    }
}
