using System.Diagnostics;
using Meanfield.Scans;
using Meanfield.Tests.Cli;
using Meanfield.Tests.Models;

namespace Meanfield.Tests.Scans;

/// <summary>
/// A scan subprocess killed (SIGKILL, no chance to clean up) at random points and resumed until done must give the
/// rows of an uninterrupted run: every point once, the same values, nothing left behind (common practice for
/// checkpointed batch jobs: the journal survives kill -9). Bounded and seeded: a small mesh, thirty points, four kills.
/// </summary>
public class ScanDurabilityTests
{
    private const int Seed = 1414;
    private const int Kills = 4;
    private static readonly TimeSpan Patience = TimeSpan.FromSeconds(60);

    private const string Scan = """
        # Durability test scan (invented numbers): thirty values of V on a 10^3 mesh (slow enough for kills to land).
        model = "model.toml"
        temperature = "2 K"

        [[axis]]
        name = "V"
        from = 120
        to = 230
        points = 30

        [solver]
        mesh = 10
        """;

    [Fact]
    public async Task Killed_and_resumed_scan_matches_an_uninterrupted_run()
    {
        var cli = Path.Combine(AppContext.BaseDirectory, "Meanfield.Cli.dll");
        Assert.True(File.Exists(cli), $"the command-line program is not next to the tests: {cli}");
        var dir = Directory.CreateTempSubdirectory("meanfield-durability-").FullName;
        try
        {
            File.Copy(Path.Combine(ModelText.RepositoryRoot(), "tests", "Meanfield.Tests", "Corpus", "_base", "kondo.toml"), Path.Combine(dir, "model.toml"));
            var scanFile = Path.Combine(dir, "s.toml");
            File.WriteAllText(scanFile, Scan);
            var reference = Path.Combine(dir, "reference.parquet");
            var (code, _, err) = CliRun.Run("scan", scanFile, "--out", reference);
            Assert.True(code == 0, err);

            var output = Path.Combine(dir, "o.parquet");
            string[] args = ["scan", scanFile, "--out", output, "--resume", "--checkpoint-every", "1"];
            var random = new Random(Seed);
            int landed = 0;
            for (int k = 0; k < Kills; k++)
            {
                // Kill once the run has checkpointed a random number of new points, a random few milliseconds later.
                int target = ChunkCount(output) + random.Next(1, 3);
                int extraMs = random.Next(0, 40);
                using var p = Start(cli, args);
                var clock = Stopwatch.StartNew();
                while (!p.HasExited && ChunkCount(output) < target && clock.Elapsed < Patience) await Task.Delay(5);
                await Task.Delay(extraMs);
                if (p.HasExited) break; // finished before the kill
                p.Kill(entireProcessTree: true);
                await p.WaitForExitAsync();
                landed++;
            }
            using (var last = Start(cli, args))
            {
                Assert.True(last.WaitForExit(Patience), "the final resume did not finish");
                Assert.True(last.ExitCode == 0, await last.StandardError.ReadToEndAsync());
            }
            Assert.True(landed >= 2, $"only {landed} kills landed while the scan was running");

            var expected = await ScanParquet.ReadAsync(reference);
            var actual = await ScanParquet.ReadAsync(output);
            Assert.Equal(expected.Rows.Select(r => r.PointId), actual.Rows.Select(r => r.PointId)); // each point once, in order
            foreach (var (e, a) in expected.Rows.Zip(actual.Rows))
            {
                Assert.Equal(e.Result.Converged, a.Result.Converged);
                Assert.Equal(e.Result.Spectrum.Phase, a.Result.Spectrum.Phase);
                Assert.Equal(e.Result.Groups[0].R, a.Result.Groups[0].R, 1e-7);
                Assert.Equal(e.Result.Mu, a.Result.Mu, 1e-6 * Math.Max(1, Math.Abs(e.Result.Mu)));
            }
            Assert.False(Directory.Exists(output + ".parts"), "chunk directory left behind");
            Assert.Empty(Directory.GetFiles(dir, "*.tmp"));
        }
        finally { try { Directory.Delete(dir, true); } catch (IOException) { } }
    }

    private static int ChunkCount(string output) =>
        Directory.Exists(output + ".parts") ? Directory.GetFiles(output + ".parts", "chunk-*.parquet").Length : 0;

    private static Process Start(string cli, string[] args)
    {
        var info = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        info.ArgumentList.Add(cli);
        foreach (var a in args) info.ArgumentList.Add(a);
        var p = Process.Start(info)!;
        p.OutputDataReceived += (_, _) => { };
        p.BeginOutputReadLine();
        return p;
    }
}
