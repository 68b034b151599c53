import express, { type RequestHandler } from 'express';

/** Deepest nesting of arrays and objects a JSON body may have. Chain documents need about 5. */
export const MAX_JSON_DEPTH = 32;
/** Most elements one JSON array in a body may hold. The largest schema array allows 64. */
export const MAX_JSON_ARRAY_LENGTH = 10_000;

/** A body whose shape is beyond the limits above: a 400 before anything walks the body. */
export class JsonShapeError extends Error {
  readonly status = 400;
  readonly type = 'entity.shape.refused';
  constructor(message: string) {
    super(message);
  }
}

const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const COMMA = 0x2c;
const OPEN_ARRAY = 0x5b;
const CLOSE_ARRAY = 0x5d;
const OPEN_OBJECT = 0x7b;
const CLOSE_OBJECT = 0x7d;
const LETTER_U = 0x75;
const DIGIT_0 = 0x30;

/** Whether the escape at `bytes[i]` (just after a backslash) is `u0000`, a NUL character. */
function isNulEscape(bytes: Uint8Array, i: number): boolean {
  return (
    bytes[i] === LETTER_U &&
    bytes[i + 1] === DIGIT_0 &&
    bytes[i + 2] === DIGIT_0 &&
    bytes[i + 3] === DIGIT_0 &&
    bytes[i + 4] === DIGIT_0
  );
}

/**
 * Scans raw JSON bytes once, without recursion, and throws JsonShapeError when nesting is
 * deeper than `maxDepth` or an array holds more than `maxArrayLength` elements. Bytes inside
 * strings are skipped (UTF-8 continuation bytes never equal an ASCII bracket). Malformed
 * JSON is left for the parser to refuse.
 * @returns whether a string (a key or a value) holds the escape `\u0000`: the only way a
 * NUL character can be in parsed JSON, since the parser refuses a raw control character in
 * a string. Without one, no walk of the parsed body for NUL is needed (./reject-nul.ts).
 */
export function checkJsonShape(
  bytes: Uint8Array,
  maxDepth = MAX_JSON_DEPTH,
  maxArrayLength = MAX_JSON_ARRAY_LENGTH,
): boolean {
  // Per open container: -1 for an object, else the number of commas seen in the array.
  const open: number[] = [];
  let inString = false;
  let nul = false;
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i];
    if (inString) {
      if (b === BACKSLASH) {
        if (!nul && isNulEscape(bytes, i + 1)) nul = true;
        i++;
      } else if (b === QUOTE) inString = false;
      continue;
    }
    if (b === QUOTE) inString = true;
    else if (b === OPEN_ARRAY || b === OPEN_OBJECT) {
      if (open.length >= maxDepth) {
        throw new JsonShapeError(
          `the request body nests arrays and objects more than ${maxDepth} levels deep; ` +
            'send a flatter body',
        );
      }
      open.push(b === OPEN_ARRAY ? 0 : -1);
    } else if (b === CLOSE_ARRAY || b === CLOSE_OBJECT) open.pop();
    else if (b === COMMA && open.length > 0 && open[open.length - 1] >= 0) {
      const commas = ++open[open.length - 1];
      if (commas >= maxArrayLength) {
        throw new JsonShapeError(
          `an array in the request body has more than ${maxArrayLength} elements; ` +
            'send fewer (or split the request)',
        );
      }
    }
  }
  return nul;
}

const NUL_SCAN = Symbol('chainwright.bodyNulScan');

/**
 * Whether the body the JSON parser gave `req` may hold a NUL character: true unless the scan
 * of its raw bytes found no `\u0000` escape (or there is no body at all).
 */
export function bodyMayHoldNul(req: object): boolean {
  return (req as { [NUL_SCAN]?: boolean })[NUL_SCAN] !== false;
}

/**
 * The JSON body parser: express.json with a size limit, and a shape check on the raw bytes
 * that runs before parsing, so a hostile body is refused in one cheap pass on any path,
 * before sign-in or the CSRF check, and nothing later recurses through it.
 */
export function jsonBody(limitBytes: number): RequestHandler {
  return express.json({
    limit: limitBytes,
    verify: (req, _res, buf) => {
      (req as { [NUL_SCAN]?: boolean })[NUL_SCAN] = checkJsonShape(buf);
    },
  });
}
