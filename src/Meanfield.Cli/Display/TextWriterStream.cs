using System.Text;

namespace Meanfield.Cli.Display;

/// <summary>
/// A write-only stream that decodes UTF-8 into a <see cref="TextWriter"/>: `--out -` on a command run with a captured
/// output (tests, embedding hosts) rather than the process's own standard output.
/// </summary>
public sealed class TextWriterStream(TextWriter writer) : Output.WriteOnlyStream
{
    private readonly Decoder _decoder = new UTF8Encoding(false).GetDecoder();

    public override void Flush() => writer.Flush();

    public override void Write(ReadOnlySpan<byte> buffer)
    {
        var chars = new char[_decoder.GetCharCount(buffer, flush: false)];
        int n = _decoder.GetChars(buffer, chars, flush: false);
        writer.Write(chars, 0, n);
    }
}
