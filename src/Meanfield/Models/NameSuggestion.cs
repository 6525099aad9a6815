namespace Meanfield.Models;

/// <summary>Closest-name hints for typos (Levenshtein edit distance).</summary>
public static class NameSuggestion
{
    /// <summary>The candidate nearest to <paramref name="name"/>, or null when none is plausibly a typo of it.</summary>
    public static string? Closest(string name, IEnumerable<string> candidates)
    {
        string? best = null;
        int bestDistance = int.MaxValue;
        foreach (var c in candidates)
        {
            int d = Distance(name.ToLowerInvariant(), c.ToLowerInvariant());
            if (d < bestDistance) { best = c; bestDistance = d; }
        }
        // A hint is only useful when it is nearer than a rewrite: allow about a third of the letters to differ.
        return best is not null && bestDistance <= Math.Max(2, Math.Max(name.Length, best.Length) / 3) ? best : null;
    }

    /// <summary>" (did you mean 'x'?)" or "".</summary>
    public static string Format(string? suggestion) => suggestion is null ? "" : $" (did you mean '{suggestion}'?)";

    public static int Distance(string a, string b)
    {
        var previous = new int[b.Length + 1];
        var current = new int[b.Length + 1];
        for (int j = 0; j <= b.Length; j++) previous[j] = j;
        for (int i = 1; i <= a.Length; i++)
        {
            current[0] = i;
            for (int j = 1; j <= b.Length; j++)
            {
                int cost = a[i - 1] == b[j - 1] ? 0 : 1;
                current[j] = Math.Min(Math.Min(current[j - 1] + 1, previous[j] + 1), previous[j - 1] + cost);
            }
            (previous, current) = (current, previous);
        }
        return previous[b.Length];
    }
}
