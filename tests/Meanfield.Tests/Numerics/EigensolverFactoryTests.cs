using Meanfield.Numerics;

namespace Meanfield.Tests.Numerics;

public class EigensolverFactoryTests
{
    [Theory]
    [InlineData(1)]
    [InlineData(8)]
    [InlineData(LinearAlgebraBackend.LargeMatrixThreshold - 1)]
    public void SmallMatrices_GetHouseholderQl(int n)
    {
        var s = Eigensolvers.Create(n);
        Assert.IsType<HouseholderQlEigensolver>(s);
        Assert.Equal(n, s.Size);
    }

    [Fact]
    public void LargeMatrices_GetLapackWhenPresentElseHouseholderQl()
    {
        var s = Eigensolvers.Create(LinearAlgebraBackend.LargeMatrixThreshold);
        if (LapackEigensolver.IsAvailable) Assert.IsType<LapackEigensolver>(s);
        else Assert.IsType<HouseholderQlEigensolver>(s);
        Assert.Equal(LinearAlgebraBackend.LargeMatrixThreshold, s.Size);
    }

    [Fact]
    public void Description_NamesTheBackendsInUse()
    {
        string d = LinearAlgebraBackend.Description;
        Assert.Contains("Householder-QL", d);
        Assert.Contains(LapackEigensolver.IsAvailable ? $"LAPACK zheevd ({LapackEigensolver.LibraryName})" : "no LAPACK found", d);
        Assert.DoesNotContain('\n', d);
    }
}
