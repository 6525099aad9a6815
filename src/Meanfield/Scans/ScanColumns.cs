namespace Meanfield.Scans;

/// <summary>The column list of a scan output, in file order.</summary>
internal static class ScanColumns
{
    public static IReadOnlyList<ScanColumn> Build(ScanSchema s)
    {
        var c = new List<ScanColumn>
        {
            new ValueColumn<int>("point_id", "", r => r.PointId, (d, v) => d.PointId = v),
            new ValueColumn<int>("shard", "", r => r.Shard, (d, v) => d.Shard = v),
        };
        for (int i = 0; i < s.AxisNames.Count; i++)
        {
            int k = i;
            c.Add(new ValueColumn<double>("axis_" + s.AxisNames[k], "axis unit (see grid metadata)",
                                          r => r.AxisValues[k], (d, v) => d.Axes[k] = v));
        }
        for (int i = 0; i < s.ParameterNames.Count; i++)
        {
            int k = i;
            string name = s.ParameterNames[k];
            c.Add(new NullableColumn<double>("param_" + name, "model unit", r => r.Parameter(name), (d, v) => d.Parameters[k] = v));
        }
        c.Add(new ValueColumn<double>("temperature_K", "K", r => r.TemperatureK, (d, v) => d.TemperatureK = v));
        c.Add(new ValueColumn<bool>("converged", "", r => r.Result.Converged, (d, v) => d.Converged = v));
        c.Add(new ValueColumn<int>("iterations", "", r => r.Result.Iterations, (d, v) => d.Iterations = v));
        c.Add(new NullableColumn<double>("residual_norm", "", r => Known(r.Result.ResidualNorm), (d, v) => d.ResidualNorm = v ?? double.NaN));
        c.Add(new NullableColumn<double>("mu", "{E}", r => Known(r.Result.Mu), (d, v) => d.Mu = v ?? double.NaN));
        c.Add(new NullableColumn<double>("free_energy", "{E} per cell", r => Known(r.Result.FreeEnergy), (d, v) => d.FreeEnergy = v ?? double.NaN));
        for (int i = 0; i < s.GroupNames.Count; i++)
        {
            int k = i;
            string g = s.GroupNames[k];
            c.Add(new NullableColumn<double>("r_" + g, "", r => Known(r.Result.Groups[k].R), (d, v) => d.R[k] = v ?? double.NaN));
            c.Add(new NullableColumn<double>("lambda_" + g, "{E}", r => Known(r.Result.Groups[k].Lambda), (d, v) => d.Lambda[k] = v ?? double.NaN));
            c.Add(new NullableColumn<double>("n_f_" + g, "electrons per site", r => Known(r.Result.Groups[k].Nf), (d, v) => d.Nf[k] = v ?? double.NaN));
        }
        // The digest's columns: read from and written to the one SpectrumColumns record.
        c.Add(new NullableColumn<double>("direct_gap", "{E}", r => r.Result.Spectrum.DirectGap, (d, v) => d.Spectrum = d.Spectrum with { DirectGap = v }));
        c.Add(new NullableColumn<double>("indirect_gap", "{E}", r => r.Result.Spectrum.IndirectGap, (d, v) => d.Spectrum = d.Spectrum with { IndirectGap = v }));
        c.Add(new NullableColumn<double>("dos_fermi_total", "states per {E} per cell", r => r.Result.Spectrum.DosFermiTotal, (d, v) => d.Spectrum = d.Spectrum with { DosFermiTotal = v }));
        c.Add(new NullableColumn<double>("dos_fermi_correlated", "states per {E} per cell", r => r.Result.Spectrum.DosFermiCorrelated, (d, v) => d.Spectrum = d.Spectrum with { DosFermiCorrelated = v }));
        c.Add(new NullableColumn<int>("node_count", "", r => r.Result.Spectrum.NodeCount, (d, v) => d.Spectrum = d.Spectrum with { NodeCount = v }));
        c.Add(new NullableColumn<int>("pinned_nodes", "", r => r.Result.Spectrum.PinnedNodes, (d, v) => d.Spectrum = d.Spectrum with { PinnedNodes = v }));
        c.Add(new NullableColumn<double>("max_node_offset", "{E}", r => r.Result.Spectrum.MaxNodeOffset, (d, v) => d.Spectrum = d.Spectrum with { MaxNodeOffset = v }));
        c.Add(new NullableColumn<int>("net_chirality", "", r => r.Result.Spectrum.NetChirality, (d, v) => d.Spectrum = d.Spectrum with { NetChirality = v }));
        c.Add(new NullableColumn<int>("abs_chirality", "", r => r.Result.Spectrum.AbsChirality, (d, v) => d.Spectrum = d.Spectrum with { AbsChirality = v }));
        c.Add(new NullableColumn<double>("gamma_mJ_per_mol_K2", "mJ mol^-1 K^-2", r => r.Result.Spectrum.GammaMilliJoulePerMolK2, (d, v) => d.Spectrum = d.Spectrum with { GammaMilliJoulePerMolK2 = v }));
        c.Add(new NullableColumn<double>("beta_mJ_per_mol_K4", "mJ mol^-1 K^-4", r => r.Result.Spectrum.BetaMilliJoulePerMolK4, (d, v) => d.Spectrum = d.Spectrum with { BetaMilliJoulePerMolK4 = v }));
        c.Add(new TextColumn("z2", "(nu0;nu1nu2nu3) in 3D, nu in 2D", r => r.Result.Spectrum.Z2, (d, v) => d.Spectrum = d.Spectrum with { Z2 = v }));
        c.Add(new NullableColumn<int>("chern_number", "", r => r.Result.Spectrum.ChernNumber, (d, v) => d.Spectrum = d.Spectrum with { ChernNumber = v }));
        c.Add(new TextColumn("phase", "", r => r.Result.Spectrum.Phase, (d, v) => d.Spectrum = d.Spectrum with { Phase = v }));
        c.Add(new TextColumn("phase_reason", "", r => r.Result.Spectrum.PhaseReason, (d, v) => d.Spectrum = d.Spectrum with { PhaseReason = v }));
        if (s.IncludeErrorColumn) c.Add(new TextColumn("error", "", r => r.Result.Error, (d, v) => d.Error = v));
        c.Add(new ValueColumn<double>("wall_seconds", "s", r => r.WallSeconds, (d, v) => d.WallSeconds = v));
        c.Add(new ValueColumn<bool>("warm_started", "", r => r.WarmStarted, (d, v) => d.WarmStarted = v));
        if (s.IncludeSolverState) c.Add(new SolverStateColumn());
        return c;
    }

    /// <summary>A value for the file: null where the point has none (a failed solve), never NaN.</summary>
    private static double? Known(double v) => double.IsFinite(v) ? v : null;
}
