using System.CommandLine;
using Meanfield.Scans;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield scan merge DIR|FILES --out FILE [--allow-incomplete]` joins the shard files of a cluster run.</summary>
public static class ScanMergeCommand
{
    public static Command Build()
    {
        var inputs = new Argument<string[]>("INPUTS") { Description = "A directory of shard files (*.shard-*-of-*.parquet) or the shard files themselves", Arity = ArgumentArity.OneOrMore };
        var output = new Option<string>("--out", "-o") { Description = "Merged result file (.parquet)", Required = true };
        var allow = new Option<bool>("--allow-incomplete") { Description = "Write the merged file even when points are missing (never with duplicates)" };
        var merge = new Command("merge", "Merge the shard files of one scan, checking that every point is there exactly once") { inputs, output, allow };
        merge.SetAction(async (parse, ct) =>
        {
            var o = parse.InvocationConfiguration.Output;
            var e = parse.InvocationConfiguration.Error;
            var target = parse.GetValue(output)!;
            var files = ScanMerge.CollectShardFiles(parse.GetValue(inputs)!);
            Output.OutputGuard.Check(target, files);
            var report = await ScanMerge.MergeAsync(files, target, parse.GetValue(allow), ct);
            (report.Complete ? o : e).WriteLine(report.ToString());
            if (!report.Written) return ExitCodes.NoAnswer;
            o.WriteLine($"wrote {Path.GetFullPath(target)}" + (report.Complete ? "" : " (incomplete: --allow-incomplete)"));
            return ExitCodes.Success;
        });
        return merge;
    }
}
