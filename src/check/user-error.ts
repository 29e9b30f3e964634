/**
 * An error the user caused (bad flag, bad sheet, unwritable path, too large a
 * plate). The command line prints its message as one line and exits with 2.
 * Every such error is worded alike, after sharp's argument errors:
 * "Expected <expected> for <field> but received <received>".
 */
export class UserError extends Error {
  readonly field: string;
  readonly expected: string;
  readonly received: string;

  constructor(field: string, expected: string, received: unknown) {
    const shown = showValue(received);
    super(`Expected ${expected} for ${field} but received ${shown}`);
    this.name = 'UserError';
    this.field = field;
    this.expected = expected;
    this.received = shown;
  }

  /** The same error told of another field (e.g. the flag that set a sheet field). */
  withField(field: string): UserError {
    return new UserError(field, this.expected, new Received(this.received));
  }
}

/** A description of what was received, shown as written (not quoted as a value). */
export class Received {
  constructor(readonly text: string) {}
}

/** A short, one-line rendering of a received value for an error message. */
export function showValue(value: unknown): string {
  let s: string;
  if (value instanceof Received) s = value.text;
  else if (typeof value === 'string') s = JSON.stringify(value);
  else if (value === undefined) s = 'nothing';
  else {
    try {
      s = JSON.stringify(value) ?? String(value);
    } catch {
      s = String(value);
    }
  }
  s = s.replace(/\s+/g, ' ');
  // Long values (paths, decimals of many digits) differ at their ends: keep both.
  // Descriptions (Received) are our own words and say what matters: they get more room.
  const most = value instanceof Received ? 240 : 80;
  const head = Math.floor(most / 3);
  return s.length > most ? `${s.slice(0, head)}...${s.slice(-(most - head - 3))}` : s;
}

/** Throws a UserError naming the field unless the test holds. */
export function expect(ok: boolean, field: string, expected: string, received: unknown): asserts ok {
  if (!ok) throw new UserError(field, expected, received);
}
