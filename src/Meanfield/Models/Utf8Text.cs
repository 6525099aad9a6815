using System.Text;

namespace Meanfield.Models;

/// <summary>
/// Reads a text file as strict UTF-8, so that a byte of another encoding (a Latin-1 'é', say) is reported at its own
/// line and column instead of surfacing later as a confusing parser error somewhere else.
/// </summary>
public static class Utf8Text
{
    private static readonly UTF8Encoding Strict = new(encoderShouldEmitUTF8Identifier: false, throwOnInvalidBytes: true);

    /// <summary>A byte that is not valid UTF-8: its 1-based line and column (in characters) and its value.</summary>
    public readonly record struct InvalidByte(int Line, int Column, byte Value)
    {
        /// <summary>The problem in words, for error messages.</summary>
        public string Problem => $"byte 0x{Value:X2} is not UTF-8 (a file saved as Latin-1 or Windows-1252?): save the file as UTF-8";
    }

    /// <summary>The file's text (a UTF-8 byte-order mark is dropped), or the first invalid byte.</summary>
    /// <exception cref="IOException">The file cannot be read.</exception>
    public static string Read(string path, out InvalidByte? invalid) => Decode(File.ReadAllBytes(path), out invalid);

    /// <summary>Decodes <paramref name="bytes"/>; on an invalid byte returns "" and its place.</summary>
    public static string Decode(byte[] bytes, out InvalidByte? invalid)
    {
        invalid = null;
        int start = bytes.Length >= 3 && bytes[0] == 0xEF && bytes[1] == 0xBB && bytes[2] == 0xBF ? 3 : 0;
        int bad = FirstInvalid(bytes, start);
        if (bad < 0)
        {
            try { return Strict.GetString(bytes, start, bytes.Length - start); }
            catch (DecoderFallbackException) { bad = start; } // a sequence the scan below let through
        }
        int line = 1, column = 1;
        for (int i = start; i < bad; i++)
        {
            if (bytes[i] == (byte)'\n') { line++; column = 1; }
            else if ((bytes[i] & 0xC0) != 0x80) column++; // count characters, not continuation bytes
        }
        invalid = new InvalidByte(line, column, bytes[bad]);
        return "";
    }

    // Index of the first byte that does not start a well-formed UTF-8 sequence (RFC 3629, section 4), or -1.
    private static int FirstInvalid(byte[] b, int start)
    {
        int i = start;
        while (i < b.Length)
        {
            byte c = b[i];
            int n = c < 0x80 ? 0 : c is >= 0xC2 and <= 0xDF ? 1 : c is >= 0xE0 and <= 0xEF ? 2 : c is >= 0xF0 and <= 0xF4 ? 3 : -1;
            if (n < 0 || i + n >= b.Length) return i; // not a lead byte, or the sequence is cut off
            for (int k = 1; k <= n; k++)
                if ((b[i + k] & 0xC0) != 0x80) return i;
            if (n == 2 && ((c == 0xE0 && b[i + 1] < 0xA0) || (c == 0xED && b[i + 1] > 0x9F))) return i; // overlong, surrogate
            if (n == 3 && ((c == 0xF0 && b[i + 1] < 0x90) || (c == 0xF4 && b[i + 1] > 0x8F))) return i;  // overlong, > U+10FFFF
            i += n + 1;
        }
        return -1;
    }
}
