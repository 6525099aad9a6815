using System.Text.Json;
using Meanfield.Analysis;
using Meanfield.Binding;
using Meanfield.Models;
using Meanfield.Output;
using Meanfield.Solutions;
using Meanfield.Solver;
using Meanfield.Tests.Cli;

namespace Meanfield.Tests.Output;

/// <summary>
/// The solution file is written by the serialization-only generated writer and read by the metadata context. Both are
/// generated from one record with the same naming and null rules, so the writer must produce exactly the bytes the
/// metadata serializer produces, and reading the file back must give the same document. If one context's options
/// drift from the other's, these fail.
/// </summary>
public class SolutionFileTests
{
    [Theory]
    [InlineData("weyl-diamond.toml", 12)]       // nodes, chiralities, a digest with every node column
    [InlineData("kondo-insulator-sc.toml", 12)]   // a gapped digest with Z2 indices
    [InlineData("brelvanite.toml", 8)]           // finite U: the boson fields of the site entries
    public void WriterMatchesMetadataSerializerAndReadsBack(string file, int mesh)
    {
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath(file)), null);
        var settings = new SolverSettings
        {
            Temperature = model.Solver?.Temperature ?? 0, Mesh = mesh, Shifted = model.Solver?.Shifted ?? true,
        };
        var sp = new SaddlePointSolver(model, settings).Solve();
        Assert.True(sp.Converged);
        var solution = Solution.FromSaddlePoint(model, sp, settings);
        var doc = SolutionDocument.From(solution, SpectrumSummary.Compute(solution));

        string written = doc.ToJson();
        Assert.Equal(JsonSerializer.Serialize(doc, SolutionJsonContext.Default.Options), written);

        var path = Path.Combine(Directory.CreateTempSubdirectory("mf-solution-").FullName, "s.json");
        doc.Save(path);
        var back = SolutionDocument.Load(path);
        Assert.Equal(written, back.ToJson());
    }
}
