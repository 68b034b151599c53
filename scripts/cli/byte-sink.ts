/**
 * The CLI's standard output: bytes gathered in one buffer and written to the file
 * descriptor with `writeSync` when it fills, so a 100,000-row table is written in 64 KiB
 * pieces without a stream, and without loading Node's stream machinery at start-up.
 */
import { writeSync } from 'node:fs';

/** Bytes gathered before a write. */
const SIZE = 1 << 16;

/** What a blocked pipe waits between attempts, ms. */
const RETRY_MS = 2;

function errorCode(e: unknown): string | undefined {
  return (e as NodeJS.ErrnoException | null)?.code;
}

export class ByteSink {
  /** The buffer; callers write into it directly after `room(n)`, then move `pos`. */
  buf: Uint8Array = Buffer.allocUnsafe(SIZE);
  pos = 0;
  /** Set when the reader went away (EPIPE): the rest of the output is dropped. */
  closed = false;
  /** Made when first needed (SharedArrayBuffer is absent while a start-up snapshot is built). */
  private pause: Int32Array | undefined;

  constructor(private readonly fd: number) {}

  /** Makes sure `n` more bytes fit after `pos` (writing out what is gathered if needed). */
  room(n: number): void {
    if (this.pos + n <= this.buf.length) return;
    this.flush();
    if (n > this.buf.length) this.buf = Buffer.allocUnsafe(n);
  }

  /** Appends text as UTF-8. */
  text(s: string): void {
    // A UTF-16 unit is at most three bytes of UTF-8.
    this.room(3 * s.length);
    this.pos += (this.buf as Buffer).write(s, this.pos, 'utf8');
  }

  /** Writes out everything gathered. */
  flush(): void {
    let at = 0;
    while (at < this.pos && !this.closed) {
      try {
        at += writeSync(this.fd, this.buf, at, this.pos - at);
      } catch (e) {
        const code = errorCode(e);
        // A non-blocking pipe that is full: wait a moment for the reader, then go on.
        if (code === 'EAGAIN') {
          this.pause ??= new Int32Array(new SharedArrayBuffer(4));
          Atomics.wait(this.pause, 0, 0, RETRY_MS);
        }
        // The reader has gone (`analyze … | head`): nothing more can be said to it.
        else if (code === 'EPIPE') this.closed = true;
        else throw e;
      }
    }
    this.pos = 0;
  }
}
