using Meanfield.Lattices;

namespace Meanfield.Tests.Lattices;

/// <summary>The one reader of reduced wave vectors returns a result and never throws (common practice for parsers of user text).</summary>
public sealed class ReducedVectorTextTests
{
    [Theory]
    [InlineData("0,0,0.25", 0, 0, 0.25)]
    [InlineData(" 0.5 , -0.5, 1e-1 ", 0.5, -0.5, 0.1)]
    public void ReadsThreeNumbers(string text, double x, double y, double z)
    {
        var r = ReducedVectorText.Parse(text);
        Assert.True(r.Success, r.Error);
        Assert.Equal(new Vec3(x, y, z), r.Vector);
    }

    [Theory]
    [InlineData(null, "empty")]
    [InlineData("1,0", "2 component")]
    [InlineData("1,0,0,0", "4 component")]
    [InlineData("1,x,0", "'x'")]
    [InlineData("1,NaN,0", "'NaN'")]
    [InlineData("1,0,Infinity", "'Infinity'")]
    public void RefusesWhatIsNotAVector(string? text, string said)
    {
        var r = ReducedVectorText.Parse(text);
        Assert.False(r.Success);
        Assert.Contains(said, r.Error);
    }
}
