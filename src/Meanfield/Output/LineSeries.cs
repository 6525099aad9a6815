namespace Meanfield.Output;

/// <summary>One curve of a <see cref="LinePlot"/>: legend text (null for none), x and y values in the axis units.</summary>
public sealed record LineSeries(string? Label, IReadOnlyList<double> X, IReadOnlyList<double> Y, bool Dashed = false, float Width = 2);
