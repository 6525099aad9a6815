namespace Meanfield.Binding;

/// <summary>Whether an orbital is a band (conduction) orbital or the correlated shell of its site.</summary>
public enum OrbitalKind { Conduction, Correlated }

/// <summary>One orbital of the unit cell; it carries <see cref="BoundModel.Flavours"/> flavour (spin) components.</summary>
/// <param name="Name">Name as written in the model file, for example "d" or "f".</param>
/// <param name="Site">Index of the site it sits on.</param>
public sealed record Orbital(string Name, int Site, OrbitalKind Kind)
{
    public string Label(IReadOnlyList<Site> sites) => $"{sites[Site].Name}:{Name}";
}

/// <summary>A site of the unit cell with its Cartesian position tau in angstrom.</summary>
public sealed record Site(string Name, Lattices.Vec3 Position);
