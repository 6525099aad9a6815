using System.Globalization;
using System.Text;

namespace Meanfield.Scans;

/// <summary>
/// Replaces free-variable names in a tie expression by their values in parentheses, so that the model binder only
/// sees model parameter names ("ratio * lso" becomes "(0.35) * lso").
/// </summary>
public static class TieSubstitution
{
    public static string Substitute(string expression, IReadOnlyDictionary<string, double> variables)
    {
        var sb = new StringBuilder(expression.Length + 16);
        int i = 0;
        while (i < expression.Length)
        {
            char c = expression[i];
            if (char.IsDigit(c) || (c == '.' && i + 1 < expression.Length && char.IsDigit(expression[i + 1])))
            {
                int start = i;
                while (i < expression.Length && (char.IsDigit(expression[i]) || expression[i] == '.')) i++;
                // An exponent belongs to the number, so "1e5" never reads as a variable named e5.
                if (i < expression.Length && expression[i] is 'e' or 'E')
                {
                    int j = i + 1;
                    if (j < expression.Length && expression[j] is '+' or '-') j++;
                    if (j < expression.Length && char.IsDigit(expression[j]))
                    {
                        i = j;
                        while (i < expression.Length && char.IsDigit(expression[i])) i++;
                    }
                }
                sb.Append(expression, start, i - start);
            }
            else if (char.IsLetter(c) || c == '_')
            {
                int start = i;
                while (i < expression.Length && (char.IsLetterOrDigit(expression[i]) || expression[i] == '_')) i++;
                string name = expression[start..i];
                if (variables.TryGetValue(name, out double value))
                    sb.Append('(').Append(value.ToString("R", CultureInfo.InvariantCulture)).Append(')');
                else sb.Append(name);
            }
            else { sb.Append(c); i++; }
        }
        return sb.ToString();
    }

    /// <summary>Identifiers used by an expression (numbers and their exponents excluded).</summary>
    public static IReadOnlyList<string> Identifiers(string expression)
    {
        var names = new List<string>();
        int i = 0;
        while (i < expression.Length)
        {
            char c = expression[i];
            if (char.IsLetter(c) || c == '_')
            {
                int start = i;
                while (i < expression.Length && (char.IsLetterOrDigit(expression[i]) || expression[i] == '_')) i++;
                bool precededByNumber = start > 0 && (char.IsDigit(expression[start - 1]) || expression[start - 1] == '.');
                if (!precededByNumber) names.Add(expression[start..i]);
            }
            else i++;
        }
        return names;
    }
}
