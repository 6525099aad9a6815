namespace Meanfield.Scans;

/// <summary>A row being filled column by column while reading a Parquet file.</summary>
internal sealed class RowDraft(ScanSchema schema)
{
    public int PointId, Shard, Iterations;
    public double TemperatureK, ResidualNorm, Mu, FreeEnergy, WallSeconds;
    public bool Converged, WarmStarted;
    public readonly double[] Axes = new double[schema.AxisNames.Count];
    public readonly double?[] Parameters = new double?[schema.ParameterNames.Count];
    public readonly double[] R = new double[schema.GroupNames.Count];
    public readonly double[] Lambda = new double[schema.GroupNames.Count];
    public readonly double[] Nf = new double[schema.GroupNames.Count];
    public double? DirectGap, IndirectGap, DosFermiTotal, DosFermiCorrelated, MaxNodeOffset, Gamma, Beta;
    public int? NodeCount, NetChirality, AbsChirality;
    public string? Phase, Error;
    public double[]? SolverState;

    public ScanRow Build()
    {
        var parameters = new List<KeyValuePair<string, double>>();
        for (int i = 0; i < Parameters.Length; i++)
            if (Parameters[i] is double v) parameters.Add(new(schema.ParameterNames[i], v));
        var result = new ScanPointResult
        {
            Converged = Converged, Iterations = Iterations, ResidualNorm = ResidualNorm, Mu = Mu, FreeEnergy = FreeEnergy,
            Groups = schema.GroupNames.Select((g, i) => new GroupSolution(g, R[i], Lambda[i], Nf[i])).ToArray(),
            Parameters = parameters, DirectGap = DirectGap, IndirectGap = IndirectGap, DosFermiTotal = DosFermiTotal,
            DosFermiCorrelated = DosFermiCorrelated, NodeCount = NodeCount, MaxNodeOffset = MaxNodeOffset,
            NetChirality = NetChirality, AbsChirality = AbsChirality, GammaMilliJoulePerMolK2 = Gamma,
            BetaMilliJoulePerMolK4 = Beta, Phase = Phase, Error = Error, SolverState = SolverState,
        };
        return new ScanRow(PointId, Shard, Axes, parameters, TemperatureK, result, WallSeconds, WarmStarted);
    }
}
