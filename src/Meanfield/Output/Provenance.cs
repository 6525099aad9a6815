using System.Reflection;
using System.Security.Cryptography;
using System.Text;

namespace Meanfield.Output;

/// <summary>Where a result came from: tool version, linear-algebra backend, model text hash, creation time.</summary>
public static class Provenance
{
    /// <summary>
    /// The one version string: `--version`, `info` and every file write it. The release number with the first 7 hex
    /// digits of the source commit when the build knew it ("0.1.0+2446f7f").
    /// </summary>
    public static string ToolVersion { get; } = Shorten(
        typeof(Provenance).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion ?? "0.0.0");

    private static string Shorten(string informational)
    {
        int plus = informational.IndexOf('+');
        return plus < 0 || informational.Length - plus - 1 <= 7 ? informational : informational[..(plus + 8)];
    }

    /// <summary>SHA-256 of a model or scan text, lower-case hex (line endings normalised to \n first).</summary>
    public static string Hash(string text) =>
        Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.Replace("\r\n", "\n"))));

    public static string Backend => Numerics.Eigensolvers.Description;

    public static string NowUtc() => DateTime.UtcNow.ToString("yyyy-MM-ddTHH:mm:ssZ");
}
