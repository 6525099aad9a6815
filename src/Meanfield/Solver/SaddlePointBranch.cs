namespace Meanfield.Solver;

/// <summary>Which mean-field solution a <see cref="SaddlePoint"/> describes.</summary>
public enum SaddlePointBranch
{
    /// <summary>r &gt; 0 on every group: the f electrons hybridize coherently (heavy Fermi liquid or Kondo insulator).</summary>
    Kondo,
    /// <summary>r = 0: decoupled local moments; the conduction electrons alone carry N_e - sum Q.</summary>
    Decoupled,
}
