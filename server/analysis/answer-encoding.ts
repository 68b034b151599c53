/**
 * An analysis answer is compressed on the analysis thread, not on the event loop: the thread
 * turns the JSON text into bytes in the encoding the client accepts and hands the buffer over
 * without a copy, so the event loop only writes it. (With the `compression` middleware doing
 * it, brotli at its default quality took about as long as the analysis itself, all of it on
 * the event loop.)
 */
import type { Request, Response } from 'express';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';

export type AnswerEncoding = 'br' | 'gzip';

/** Smaller answers go as they are: compressing them saves less than it costs. */
export const MIN_COMPRESSED_BYTES = 1024;

/**
 * Brotli quality 1: about a seventh of the time of quality 4 (the middleware's default) for
 * a few per cent more bytes on a sweep (the two-metre example: about 81 KB against 76 KB).
 */
const BROTLI_QUALITY = 1;
/** gzip level 1: the fastest; a sweep's rounded numbers compress well at any level. */
const GZIP_LEVEL = 1;

/** The encoding to answer `req` in: brotli or gzip when accepted (the client's preference first). */
export function answerEncoding(req: Request): AnswerEncoding | undefined {
  const best = req.acceptsEncodings('br', 'gzip', 'identity');
  return best === 'br' || best === 'gzip' ? best : undefined;
}

/**
 * The answer's bytes in `encoding` (unless too small to gain), and the encoding used. The
 * body is always a buffer of its own, so `json` may be a view of a reused one.
 */
export function encodeAnswer(
  json: string | Uint8Array,
  encoding: AnswerEncoding | undefined,
): { body: Uint8Array; encoding?: AnswerEncoding } {
  const plain = typeof json === 'string' ? Buffer.from(json, 'utf8') : json;
  if (!encoding || plain.length < MIN_COMPRESSED_BYTES) {
    return { body: typeof json === 'string' ? plain : Buffer.from(plain) };
  }
  const body =
    encoding === 'br'
      ? brotliCompressSync(plain, {
          params: {
            [constants.BROTLI_PARAM_QUALITY]: BROTLI_QUALITY,
            [constants.BROTLI_PARAM_SIZE_HINT]: plain.length,
          },
        })
      : gzipSync(plain, { level: GZIP_LEVEL });
  return { body, encoding };
}

/** Sends answer bytes from the thread as JSON; the compression middleware leaves them be. */
export function sendAnswer(
  res: Response,
  answer: { body: Uint8Array; encoding?: AnswerEncoding },
): void {
  res.vary('Accept-Encoding');
  if (answer.encoding) res.set('Content-Encoding', answer.encoding);
  const { buffer, byteOffset, byteLength } = answer.body;
  res.type('application/json').send(Buffer.from(buffer, byteOffset, byteLength));
}
