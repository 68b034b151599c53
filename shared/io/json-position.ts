/**
 * Where JSON text first goes wrong. `JSON.parse` in Node 20 gives a character position for
 * some faults ("... at position N") and none for others ("Unexpected token ','"), so the
 * chain-file reader asks this small scanner (RFC 8259 grammar) for the offset instead.
 */

/** Offset of the first character that breaks the JSON grammar, or -1 when `text` is JSON. */
export function jsonErrorOffset(text: string): number {
  const s = new Scanner(text);
  try {
    s.ws();
    s.value();
    s.ws();
    if (s.i < text.length) throw new Fault(s.i);
    return -1;
  } catch (err) {
    if (err instanceof Fault) return err.offset;
    throw err;
  }
}

class Fault {
  constructor(readonly offset: number) {}
}

class Scanner {
  i = 0;
  constructor(private readonly t: string) {}

  ws(): void {
    while (this.i < this.t.length && ' \t\n\r'.includes(this.t[this.i])) this.i++;
  }

  private expect(ch: string): void {
    if (this.t[this.i] !== ch) throw new Fault(this.i);
    this.i++;
  }

  /** One value; containers are walked with an explicit stack, so depth cannot overflow. */
  value(): void {
    const stack: ('{' | '[')[] = [];
    for (;;) {
      this.ws();
      const c = this.t[this.i];
      if (c === '{' || c === '[') {
        this.i++;
        this.ws();
        const close = c === '{' ? '}' : ']';
        if (this.t[this.i] === close) {
          this.i++;
        } else {
          stack.push(c);
          if (c === '{') this.key();
          continue;
        }
      } else {
        this.scalar();
      }
      // After a value: close containers or go on to the next member.
      for (;;) {
        const top = stack[stack.length - 1];
        if (!top) return;
        this.ws();
        const n = this.t[this.i];
        if (n === ',') {
          this.i++;
          if (top === '{') {
            this.ws();
            this.key();
          }
          break;
        }
        this.expect(top === '{' ? '}' : ']');
        stack.pop();
      }
    }
  }

  private key(): void {
    if (this.t[this.i] !== '"') throw new Fault(this.i);
    this.string();
    this.ws();
    this.expect(':');
  }

  private scalar(): void {
    const c = this.t[this.i];
    if (c === '"') return this.string();
    for (const word of ['true', 'false', 'null']) {
      if (this.t.startsWith(word, this.i)) {
        this.i += word.length;
        return;
      }
    }
    const m = /-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/y;
    m.lastIndex = this.i;
    const hit = m.exec(this.t);
    if (!hit || hit[0] === '' || hit[0] === '-') throw new Fault(this.i);
    this.i += hit[0].length;
  }

  private string(): void {
    this.i++; // opening quote
    while (this.i < this.t.length) {
      const ch = this.t.charCodeAt(this.i);
      if (ch === 0x22) {
        this.i++;
        return;
      }
      if (ch < 0x20) throw new Fault(this.i);
      if (ch === 0x5c) {
        const e = this.t[this.i + 1];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(this.t.slice(this.i + 2, this.i + 6))) {
            throw new Fault(this.i);
          }
          this.i += 6;
          continue;
        }
        if (e === undefined || !'"\\/bfnrt'.includes(e)) throw new Fault(this.i);
        this.i += 2;
        continue;
      }
      this.i++;
    }
    throw new Fault(this.i);
  }
}
