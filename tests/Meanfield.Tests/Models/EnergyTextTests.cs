using Meanfield.Scans;
using Meanfield.Units;

namespace Meanfield.Tests.Models;

/// <summary>
/// One grammar for energies and temperatures. Conversions use k_B = 1.380649e-23 J/K and e = 1.602176634e-19 C (exact in the SI since
/// 2019), k_B = 8.617333262e-5 eV/K: 1 meV = 11.604518 K.
/// </summary>
public sealed class EnergyTextTests
{
    [Theory]
    [InlineData("2K", 2.0, "K")]
    [InlineData("2 K", 2.0, "K")]
    [InlineData(" 0.3meV ", 0.3, "meV")]
    [InlineData("1e-4 eV", 1e-4, "eV")]
    [InlineData("-5 meV", -5.0, "meV")]
    [InlineData("7.5", 7.5, null)]
    public void ReadsNumbersWithAndWithoutUnits(string text, double value, string? unit)
    {
        var r = EnergyText.Parse(text);
        Assert.True(r.Success, r.Error);
        Assert.Equal(value, r.Quantity.Value, 15);
        Assert.Equal(unit, r.Quantity.Unit?.Symbol());
    }

    [Theory]
    [InlineData("", "not a number")]
    [InlineData("K", "not a number")]
    [InlineData("2 kelvin", "unknown unit 'kelvin'")]
    [InlineData("2 Kx", "unknown unit 'Kx'")]
    [InlineData("two K", "not a number")]
    [InlineData("NaN", "not a number")]
    [InlineData("1e999 K", "finite")]
    [InlineData(null, "not a number")]
    public void RefusesWithAReasonAndNeverThrows(string? text, string reason)
    {
        var r = EnergyText.Parse(text);
        Assert.False(r.Success);
        Assert.Contains(reason, r.Error);
    }

    [Fact]
    public void ConvertsBetweenUnits()
    {
        var twoK = EnergyText.Parse("2 K").Quantity;
        Assert.Equal(2 * 1.380649e-23 / 1.602176634e-22, twoK.In(EnergyUnit.MilliElectronVolt), 14);
        Assert.Equal(2.0, twoK.Kelvin!.Value, 12);
        Assert.Equal(11.604518, EnergyText.Parse("1meV").Quantity.Kelvin!.Value, 5);
        var bare = EnergyText.Parse("0.5").Quantity;
        Assert.Null(bare.Kelvin);
        Assert.Equal(0.5, bare.In(EnergyUnit.ElectronVolt));
    }

    /// <summary>"2 K" (and "2K") means the same in a model file, a scan file and on the command line.</summary>
    [Fact]
    public void TwoKelvinIsTheSameEverywhere()
    {
        double expectedMeV = 2 * 1.380649e-23 / 1.602176634e-22;
        foreach (var text in new[] { "2 K", "2K" })
        {
            var model = ModelText.Bind(ModelText.Valid + $"\n[solver]\ntemperature = \"{text}\"\n");
            Assert.Equal(EnergyUnit.MilliElectronVolt, model.Unit);
            Assert.Equal(expectedMeV, model.Solver!.Temperature!.Value, 10);
            Assert.Equal(expectedMeV, Meanfield.Cli.CommonOptions.ParseTemperature(text, EnergyUnit.MilliElectronVolt), 10);
            Assert.True(TemperatureText.TryParseKelvin(text, out double k, out _));
            Assert.Equal(2.0, k, 12);
        }
        // A scan file is not tied to one model's unit: a bare temperature there is refused, with the fix.
        Assert.False(TemperatureText.TryParseKelvin("2", out _, out string why));
        Assert.Contains("\"2 K\"", why);
    }
}
