using System.Security.Cryptography;
using System.Text;

namespace Meanfield.Scans;

/// <summary>Where a scan came from: the texts of its model and scan files (their hashes identify the scan).</summary>
/// <param name="ModelText">Full text of the model file.</param>
/// <param name="ScanText">Full text of the scan file.</param>
/// <param name="EnergyUnit">Symbol of the model's energy unit ("meV"), used in the column units.</param>
public sealed record ScanProvenance(string ModelText, string ScanText, string EnergyUnit = "meV")
{
    public string ModelSha256 => Sha256(ModelText);
    public string ScanSha256 => Sha256(ScanText);

    public static string Sha256(string text) =>
        Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text)));
}
