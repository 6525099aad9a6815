namespace Meanfield.Symmetry;

/// <summary>Which symmetry reduces the zone sums.</summary>
public sealed record SymmetryRequest
{
    /// <summary>Find the symmetry of the model (the default): every lattice operation the Hamiltonian keeps.</summary>
    public static readonly SymmetryRequest Auto = new();
    /// <summary>No reduction: every k-point of the mesh is diagonalised.</summary>
    public static readonly SymmetryRequest None = new() { Disabled = true };

    /// <summary>True for <see cref="None"/>.</summary>
    public bool Disabled { get; init; }
    /// <summary>Operations the user asks for by name (the group they generate is used); null: find them.</summary>
    public IReadOnlyList<string>? Names { get; init; }

    /// <summary>"auto", "none", or a comma-separated list of operation names such as "3[111],m[1-10]'".</summary>
    /// <exception cref="ArgumentException">An empty list.</exception>
    public static SymmetryRequest Parse(string text)
    {
        var t = text.Trim();
        if (t.Equals("auto", StringComparison.OrdinalIgnoreCase)) return Auto;
        if (t.Equals("none", StringComparison.OrdinalIgnoreCase)) return None;
        var names = t.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        if (names.Length == 0) throw new ArgumentException($"symmetry '{text}': expected auto, none or a list of operations");
        return new SymmetryRequest { Names = names };
    }

    public override string ToString() => Disabled ? "none" : Names is null ? "auto" : string.Join(",", Names);
}
