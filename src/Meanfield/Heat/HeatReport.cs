using Meanfield.Units;

namespace Meanfield.Heat;

/// <summary>The plain-text summary of a <see cref="HeatStudyResult"/>, one line per string (the CLI prints them).</summary>
public static class HeatReport
{
    /// <summary>The summary lines: DOS, nodes and node term, low-temperature fit, departure, measured data, full mean field.</summary>
    public static IEnumerable<string> Lines(HeatStudyResult r)
    {
        var u = r.Model.Unit.Symbol();
        double k = r.Model.Unit.Kelvins();
        yield return $"quasiparticle DOS: {r.DosMethod}; {r.KPoints} k-points, {r.Dos.Energies.Length} energies ({r.Timings.Dos:F1} s)";
        yield return $"  T -> 0 Fermi level {r.FermiLevel:G10} {u}, rho(E_F) = {r.Dos.At(r.FermiLevel):G4} states/{u}/cell";
        if (r.Nodes is { } n)
        {
            if (n.Cones > 0)
            {
                yield return $"nodes at E_F: {n.Pinned.Count} type-I ({n.Cones} cones, |E - E_F| <= {n.Pinning:G3} {u}), tilt ratio |w| up to {n.LargestTiltRatio:F3}";
                yield return $"  analytic beta = {1e3 * n.MolarBeta:G5} mJ mol^-1 K^-4 = untilted {1e3 * n.MolarBetaUntilted:G5} x tilt factor 1/(1-w^2)^2 = {n.TiltFactor:G4}; mean |det hbar v|^(1/3) = {n.MeanHbarV:G5} {u} A";
            }
            else yield return $"nodes at E_F: none of the {r.Search!.Nodes.Count} touchings of bands {r.Search.OccupiedBands - 1} and {r.Search.OccupiedBands} gives a T^3 term";
        }
        var e = r.Expansion;
        yield return $"low-T fit C/T = gamma + beta T^2{(e.Terms == 3 ? " + delta T^4" : "")}: window {e.WindowMinK:G4}-{e.WindowMaxK:G4} K ({e.Points} points, max deviation {100 * e.MaxRelativeDeviation:G2} %)";
        yield return $"  gamma = {e.GammaMilli:G4} +- {1e3 * e.GammaError:G2} mJ mol^-1 K^-2, beta = {1e3 * e.Beta:G6} +- {1e3 * e.BetaError:G2} mJ mol^-1 K^-4"
                     + (e.Terms == 3 ? $", delta = {1e3 * e.Delta:G4} +- {1e3 * e.DeltaError:G2} mJ mol^-1 K^-6" : "");
        if (r.BetaRatio is { } ratio)
            yield return $"  beta / analytic = {ratio:F4}; C/T^3 at {r.Curve.TemperaturesK[0]:G3} K / analytic beta = {r.LowestRatio:F4}";
        if (r.VelocityFromBeta is { } v)
            yield return $"  v* from beta ({v.Nodes} untilted isotropic cones): hbar v* = {v.HbarV:G5} +- {v.HbarVError:G2} {u} A = {v.MetresPerSecond:G4} +- {v.MetresPerSecondError:G2} m/s";
        if (r.PowerLaw is { } p) yield return $"  power law over the window: C ~ T^{p.Exponent:F3} +- {p.ExponentError:F3}";
        string law = r.Nodes is { Cones: > 0 } && Math.Abs(e.Gamma) <= 3 * e.GammaError ? "the T^3 law beta T^3" : "gamma T + beta T^3";
        yield return r.DepartureK is { } d
            ? $"  C leaves {law} by more than {HeatStudy.DeparturePercent} % from {d:G4} K (k_B T = {d / k:G3} {u})"
            : $"  C stays within {HeatStudy.DeparturePercent} % of {law} over the whole range";
        if (r.Nodes is { Cones: > 0 })
            yield return r.Agreement is { } a
                ? $"  numerical and analytic node heat agree within {100 * HeatStudy.AgreementTolerance} % from {a.MinK:G4} to {a.MaxK:G4} K"
                : $"  numerical and analytic node heat agree within {100 * HeatStudy.AgreementTolerance} % nowhere in the range";
        foreach (var note in r.Notes) yield return $"note: {note}";
        if (r.Comparison is { } c)
        {
            var m = r.Measured!;
            yield return $"measured: {m.SourcePath} ({m.Curve.Count} points{(m.Subtracted.Length > 0 ? ", minus " + m.Subtracted : "")})";
            yield return $"{"",-34}{"predicted",16}{"measured",16}";
            yield return $"{"gamma (mJ mol^-1 K^-2)",-34}{c.PredictedSommerfeld.GammaMilli,16:G5}{c.MeasuredSommerfeld.GammaMilli,16:G5}";
            yield return $"{"beta (mJ mol^-1 K^-4)",-34}{1e3 * c.PredictedSommerfeld.Beta,16:G4}{1e3 * c.MeasuredSommerfeld.Beta,16:G4}";
            yield return $"{"alpha (C ~ T^alpha)",-34}{c.PredictedPowerLaw.Exponent,16:F3}{c.MeasuredPowerLaw.Exponent,16:F3}";
            yield return $"gamma measured / predicted = {c.GammaRatio:G4}; rms relative residual {c.RmsRelativeResidual:P1} over {c.Residuals.Count} points (fit window {c.PredictedSommerfeld.WindowMinK:G4}-{c.PredictedSommerfeld.WindowMaxK:G4} K)";
            var dep = LowTemperatureLaw.DepartureTemperature(m.Curve, c.MeasuredSommerfeld, 10, consecutive: 3);
            yield return dep is { } dm ? $"  measured C/T leaves its fitted law by more than 10 % (3 points running) from {dm:G4} K" : "  measured C/T stays within 10 % of its fitted law";
        }
        if (r.Sweep is { } s)
        {
            var pts = s.Points;
            yield return $"full mean field: {pts.Count} saddle points from {pts[0].TemperatureK:G4} to {pts[^1].TemperatureK:G4} K ({r.Timings.FullMeanField:F1} s)";
            yield return s.LastKondoK is { } lo && s.FirstDecoupledK is { } hi
                ? $"C_full jumps at T_K^MF between {lo:G5} and {hi:G5} K, where r drops to 0: an artifact of the mean-field approximation (in reality the Kondo scale is a crossover, not a transition)"
                : "C_full: no change of branch in the range (T_K^MF lies outside it)";
        }
    }
}
