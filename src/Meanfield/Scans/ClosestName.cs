namespace Meanfield.Scans;

/// <summary>Suggests the closest valid key for a misspelt one (Levenshtein distance, Levenshtein 1966).</summary>
internal static class ClosestName
{
    public static string Hint(string name, IEnumerable<string> valid)
    {
        string? best = null;
        int bestDistance = int.MaxValue;
        foreach (var v in valid)
        {
            int d = Distance(name.ToLowerInvariant(), v.ToLowerInvariant());
            if (d < bestDistance) { bestDistance = d; best = v; }
        }
        return best is not null && bestDistance <= Math.Max(2, name.Length / 2)
            ? $" (did you mean '{best}'?)"
            : $" (valid: {string.Join(", ", valid)})";
    }

    public static int Distance(string a, string b)
    {
        var prev = new int[b.Length + 1];
        var cur = new int[b.Length + 1];
        for (int j = 0; j <= b.Length; j++) prev[j] = j;
        for (int i = 1; i <= a.Length; i++)
        {
            cur[0] = i;
            for (int j = 1; j <= b.Length; j++)
                cur[j] = Math.Min(Math.Min(cur[j - 1] + 1, prev[j] + 1), prev[j - 1] + (a[i - 1] == b[j - 1] ? 0 : 1));
            (prev, cur) = (cur, prev);
        }
        return prev[b.Length];
    }
}
