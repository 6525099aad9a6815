using System.Text;

namespace Meanfield.Cli.Display;

/// <summary>
/// A write-only stream that decodes UTF-8 into a <see cref="TextWriter"/>: `--out -` on a command run with a captured
/// output (tests, embedding hosts) rather than the process's own standard output.
/// </summary>
public sealed class TextWriterStream(TextWriter writer) : Stream
{
    private readonly Decoder _decoder = new UTF8Encoding(false).GetDecoder();

    public override bool CanRead => false;
    public override bool CanSeek => false;
    public override bool CanWrite => true;
    public override long Length => throw new NotSupportedException();
    public override long Position { get => throw new NotSupportedException(); set => throw new NotSupportedException(); }
    public override void Flush() => writer.Flush();
    public override int Read(byte[] buffer, int offset, int count) => throw new NotSupportedException();
    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
    public override void SetLength(long value) => throw new NotSupportedException();
    public override void Write(byte[] buffer, int offset, int count) => Write(buffer.AsSpan(offset, count));

    public override void Write(ReadOnlySpan<byte> buffer)
    {
        var chars = new char[_decoder.GetCharCount(buffer, flush: false)];
        int n = _decoder.GetChars(buffer, chars, flush: false);
        writer.Write(chars, 0, n);
    }
}
