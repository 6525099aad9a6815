using Meanfield.Heat;

namespace Meanfield.Tests.Heat;

public class MeasuredHeatCsvTests
{
    private static MeasuredHeat Parse(string text) => MeasuredHeatCsv.Parse(text.Split('\n'), "x.csv");

    private static HeatDataError Bad(string text) => Assert.Throws<HeatDataError>(() => Parse(text));

    [Fact]
    public void ReadsBothHeatColumnsAndComments()
    {
        var a = Parse("# invented\nT_K,C_J_per_mol_K\n2,0.4\n1,0.2\n\n 3 , 0.6 \n");
        Assert.Equal(new[] { 1.0, 2.0, 3.0 }, a.Curve.TemperaturesK);
        Assert.Equal(new[] { 4, 3, 6 }, a.Lines);
        // C/T = 200 mJ mol^-1 K^-2 at T = 2 K is C = 0.4 J mol^-1 K^-1 (unit conversion).
        var b = Parse("C_over_T_mJ_per_mol_K2,T_K\n200,2\n200,1\n200,3");
        Assert.Equal(0.4, b.Curve.At(2), 1e-15);
        Assert.Equal(0.6, b.Curve.At(3), 1e-15);
    }

    [Theory]
    [InlineData("T_K,C\n1,1\n2,2\n3,3", 1, "C")]                                           // unknown column
    [InlineData("# c\nT_K\n1\n2\n3", 2, "C_J_per_mol_K")]                                // missing C column
    [InlineData("C_J_per_mol_K\n1\n2\n3", 1, "T_K")]                                      // missing T column
    [InlineData("T_K,C_J_per_mol_K,C_over_T_mJ_per_mol_K2\n1,1,1", 1, "C_over_T_mJ_per_mol_K2")] // both C columns
    [InlineData("T_K,C_J_per_mol_K\n1,0.1\n2,abc\n3,0.3", 3, "C_J_per_mol_K")]              // non-numeric
    [InlineData("T_K,C_J_per_mol_K\n1,0.1\nNaN,0.2\n3,0.3", 3, "T_K")]                      // not finite
    [InlineData("T_K,C_J_per_mol_K\n1,0.1\n# gap\n0,0.2\n3,0.3", 4, "T_K")]                 // T <= 0
    [InlineData("T_K,C_J_per_mol_K\n1,0.1\n-2,0.2\n3,0.3", 3, "T_K")]                       // T < 0
    [InlineData("T_K,C_J_per_mol_K\n1,0.1\n2,0.2\n1.0,0.3", 4, "T_K")]                      // duplicated T
    [InlineData("T_K,C_J_per_mol_K\n1,0.1\n2,0.2", 1, "T_K")]                               // fewer than 3 rows
    [InlineData("T_K,C_J_per_mol_K\n1,0.1\n2\n3,0.3", 3, "C_J_per_mol_K")]                  // missing cell
    [InlineData("T_K,C_J_per_mol_K\n1,0.1\n2,0.2,7\n3,0.3", 3, "#3")]                       // extra cell
    public void BadInputNamesLineAndColumn(string text, int line, string column)
    {
        var ex = Bad(text);
        Assert.Equal("x.csv", ex.File);
        Assert.Equal(line, ex.Line);
        Assert.Equal(column, ex.Column);
        Assert.Contains($"x.csv:{line}:", ex.Message);
    }

    [Fact]
    public void MissingFileIsAHeatDataError()
    {
        var ex = Assert.Throws<HeatDataError>(() => MeasuredHeatCsv.Load("/nonexistent/heat.csv"));
        Assert.Equal("/nonexistent/heat.csv", ex.File);
    }

    // Subtraction of a Debye term leaves exactly the electronic part of synthetic data (Ashcroft & Mermin ch. 23).
    [Fact]
    public void DebyeSubtractionLeavesElectronicPart()
    {
        var debye = new Debye(200, 3);
        var t = new[] { 1.0, 2, 4, 8 };
        var lines = t.Select(x => FormattableString.Invariant($"{x},{0.1 * x + debye.MolarHeat(x)}")).Prepend("T_K,C_J_per_mol_K");
        var data = PhononSubtraction.Debye(MeasuredHeatCsv.Parse(lines.ToArray(), "d.csv"), 200, 3);
        for (int i = 0; i < t.Length; i++) Assert.Equal(0.1 * t[i], data.Curve.MolarHeat[i], 1e-12);
        Assert.Contains("Theta_D = 200 K", data.Subtracted);
    }

    // Reference compound: C_ref interpolated linearly in T; a reference not covering the data names the data line.
    [Fact]
    public void ReferenceSubtractionInterpolatesAndChecksRange()
    {
        var reference = Parse("T_K,C_J_per_mol_K\n1,0.01\n3,0.03\n5,0.05");
        var data = MeasuredHeatCsv.Parse(["T_K,C_J_per_mol_K", "2,0.52", "4,1.04", "5,1.3"], "m.csv");
        var sub = PhononSubtraction.Reference(data, reference);
        Assert.Equal(0.5, sub.Curve.MolarHeat[0], 1e-14);
        Assert.Equal(1.0, sub.Curve.MolarHeat[1], 1e-14);
        var outside = MeasuredHeatCsv.Parse(["T_K,C_J_per_mol_K", "2,0.5", "4,1", "", "6,1.5"], "m.csv");
        var ex = Assert.Throws<HeatDataError>(() => PhononSubtraction.Reference(outside, reference));
        Assert.Equal(5, ex.Line);
        Assert.Equal("T_K", ex.Column);
        Assert.Contains("x.csv", ex.Message);
    }
}
