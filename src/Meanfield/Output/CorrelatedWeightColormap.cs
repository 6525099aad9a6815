using ScottPlot;

namespace Meanfield.Output;

/// <summary>
/// Colour scale for orbital character: blue for pure conduction states (weight 0) through purple to red for pure
/// correlated states (weight 1); both ends stay dark enough to read on white.
/// </summary>
internal sealed class CorrelatedWeightColormap : IColormap
{
    /// <summary>The colour of pure conduction states (weight 0), also the conduction part of DOS pictures.</summary>
    public static readonly Color ConductionColour = new(30, 90, 200);
    /// <summary>The colour of pure correlated states (weight 1), also the correlated part of DOS pictures.</summary>
    public static readonly Color CorrelatedColour = new(215, 40, 30);
    private static readonly Color Conduction = ConductionColour;
    private static readonly Color Correlated = CorrelatedColour;

    public string Name => "conduction-correlated";

    public Color GetColor(double position)
    {
        double t = double.IsFinite(position) ? Math.Clamp(position, 0, 1) : 0;
        return new Color(
            (byte)Math.Round(Conduction.R + t * (Correlated.R - Conduction.R)),
            (byte)Math.Round(Conduction.G + t * (Correlated.G - Conduction.G)),
            (byte)Math.Round(Conduction.B + t * (Correlated.B - Conduction.B)));
    }

    /// <summary>What a <see cref="ScottPlot.Panels.ColorBar"/> needs: this colour scale over weights 0..1.</summary>
    internal sealed class Axis : IHasColorAxis
    {
        public IColormap Colormap { get; set; } = new CorrelatedWeightColormap();
        public ScottPlot.Range GetRange() => new(0, 1);
    }
}
