namespace Meanfield.Output;

/// <summary>A forward-only, write-only stream: the members a sink does not support, written once.</summary>
public abstract class WriteOnlyStream : Stream
{
    public override bool CanRead => false;
    public override bool CanSeek => false;
    public override bool CanWrite => true;
    /// <exception cref="NotSupportedException">Always: a sink has no length.</exception>
    public override long Length => throw new NotSupportedException();
    /// <exception cref="NotSupportedException">Always: a sink has no position.</exception>
    public override long Position { get => throw new NotSupportedException(); set => throw new NotSupportedException(); }
    /// <exception cref="NotSupportedException">Always.</exception>
    public override int Read(byte[] buffer, int offset, int count) => throw new NotSupportedException();
    /// <exception cref="NotSupportedException">Always.</exception>
    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
    /// <exception cref="NotSupportedException">Always.</exception>
    public override void SetLength(long value) => throw new NotSupportedException();
    public override void Write(byte[] buffer, int offset, int count) => Write(buffer.AsSpan(offset, count));
    /// <summary>Writes the bytes to the sink.</summary>
    public abstract override void Write(ReadOnlySpan<byte> buffer);
}
