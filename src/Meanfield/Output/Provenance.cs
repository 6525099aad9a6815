using System.Reflection;
using System.Security.Cryptography;
using System.Text;

namespace Meanfield.Output;

/// <summary>Where a result came from: tool version, linear-algebra backend, model text hash, creation time.</summary>
public static class Provenance
{
    public static string ToolVersion { get; } =
        typeof(Provenance).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion.Split('+')[0]
        ?? "0.0.0";

    /// <summary>SHA-256 of a model or scan text, lower-case hex (line endings normalised to \n first).</summary>
    public static string Hash(string text) =>
        Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.Replace("\r\n", "\n"))));

    public static string Backend => Numerics.Eigensolvers.Description;

    public static string NowUtc() => DateTime.UtcNow.ToString("yyyy-MM-ddTHH:mm:ssZ");
}
