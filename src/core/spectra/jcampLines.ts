/**
 * The data lines of a JCAMP-DX `(X++(Y..Y))` table as written, read without
 * decoding them (the `jcampconverter` package decodes; jcamp.ts compares):
 * the form of each line (AFFN, AFFN with exponents, ASDF), its tokens, the
 * count of ordinates, the x that starts each line against the header's
 * spacing, and the Y check values after DIF lines (McDonald & Wilks, Appl.
 * Spectrosc. 42, 151 (1988)). A line that could be read two ways is a
 * problem, never a guess.
 */

/** Where the points of an `(X++(Y..Y))` table lie: point k at `first + k·delta`; a line's written x is × `factor`. */
export interface Spacing {
  readonly first: number;
  readonly delta: number;
  readonly factor: number;
  /** Half the last written digit of `##DELTAX` when the spacing comes from it (its rounding adds up point by point). */
  readonly slackPerPoint: number;
  /** The labels the spacing comes from, for messages. */
  readonly from: string;
}

/** The Y check value of a line after a DIF line: its line, the point it repeats, its value before YFACTOR. */
export interface Check {
  readonly line: number;
  readonly index: number;
  readonly value: number;
}

/** One unit of the last digit a number is written with: 1 for `8012`, 0.01 for `1.25`, 1000 for `1E3`. */
export function resolution(written: string): number {
  const m = /^[+-]?\d*(?:\.(\d*))?(?:[Ee]([+-]?\d+))?$/.exec(written.trim());
  return m ? 10 ** (Number(m[2] ?? 0) - (m[1]?.length ?? 0)) : 0;
}

/** How a data line of an `(X++(Y..Y))` table writes its numbers. */
type Form = 'plain' | 'exponent' | 'asdf';

/** One AFFN field, with an optional exponent. */
const AFFN_FIELD = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[Ee][+-]?\d+)?$/;
/** A token of an ASDF line: blanks or commas; an AFFN number (PAC when signed); an ASDF letter and its digits. */
const ASDF_TOKEN = /[\s,]+|([+-]?(?:\d+\.?\d*|\.\d+))|([@A-Ia-i%J-Rj-rS-Zs])(\d*\.?\d*)/y;
/** A token of an AFFN line whose numbers carry exponents. */
const EXPONENT_TOKEN = /[\s,]+|([+-]?(?:\d+\.?\d*|\.\d+)(?:[Ee][+-]?\d+)?)/y;

/** A value of a data line: absolute (AFFN or SQZ), a difference (DIF) or a repeat count (DUP); `affn`: an AFFN's text. */
interface Token {
  readonly kind: 'abs' | 'dif' | 'dup';
  readonly value: number;
  readonly affn: string | null;
}

/**
 * The form of a data line. E and e are SQZ digits (+5, −5) in ASDF and exponent marks in AFFN
 * (JCAMP-DX 5.x allows `1.5E-3`), so a line whose only letters are E or e is taken as AFFN with
 * exponents only when it splits into AFFN fields, at least an x and a y; else as ASDF.
 */
function formOf(data: string): Form {
  if (/[@A-DF-Za-df-z%]/.test(data)) return 'asdf';
  if (!/[Ee]/.test(data)) return 'plain';
  const fields = data.trim().split(/[\s,]+/);
  return fields.length >= 2 && fields.every((f) => AFFN_FIELD.test(f)) ? 'exponent' : 'asdf';
}

/** An AFFN number with an exponent as a plain decimal, exactly (digits moved, not recomputed); null past ±400. */
function plainDecimal(field: string): string | null {
  const m = /^([+-]?)(\d*)(?:\.(\d*))?[Ee]([+-]?\d+)$/.exec(field);
  if (!m) return field;
  const exponent = Number(m[4]);
  if (Math.abs(exponent) > 400) return null;
  const all = m[2]! + (m[3] ?? '');
  const digits = all.replace(/^0+/, '');
  const point = m[2]!.length + exponent - (all.length - digits.length);
  if (digits === '') return '0';
  const body =
    point <= 0
      ? `0.${'0'.repeat(-point)}${digits}`
      : point >= digits.length
        ? digits + '0'.repeat(point - digits.length)
        : `${digits.slice(0, point)}.${digits.slice(point)}`;
  return (m[1] === '-' ? '-' : '') + body;
}

/** What an ASDF letter and its digits mean (SQZ @ A–I a–i, DIF % J–R j–r, DUP S–Z s; McDonald & Wilks). */
function asdfToken(letter: string, digits: string): Token | string {
  const c = letter.charCodeAt(0);
  const [kind, lead]: [Token['kind'], number] =
    c === 64
      ? ['abs', 0]
      : c >= 65 && c <= 73
        ? ['abs', c - 64]
        : c >= 97 && c <= 105
          ? ['abs', -(c - 96)]
          : c === 37
            ? ['dif', 0]
            : c >= 74 && c <= 82
              ? ['dif', c - 73]
              : c >= 106 && c <= 114
                ? ['dif', -(c - 105)]
                : ['dup', c === 115 ? 9 : c - 82];
  if (kind === 'dup' && digits.includes('.')) return `the DUP count \`${letter}${digits}\` has a decimal point`;
  const magnitude = Number(String(Math.abs(lead)) + digits);
  return { kind, value: lead < 0 ? -magnitude : magnitude, affn: null };
}

/** The tokens of a data line, or what on it is no value. */
function tokens(data: string, re: RegExp): Token[] | string {
  const out: Token[] = [];
  re.lastIndex = 0;
  while (re.lastIndex < data.length) {
    const at = re.lastIndex;
    const m = re.exec(data);
    if (!m)
      return data[at] === '?'
        ? 'a missing value `?` leaves no ordinate to integrate and would move every later point'
        : `\`${data[at]}\` (column ${at + 1}) is neither an AFFN number nor an ASDF value`;
    if (m[1] !== undefined) out.push({ kind: 'abs', value: Number(m[1]), affn: m[1] });
    else if (m[2] !== undefined) {
      const t = asdfToken(m[2], m[3]!);
      if (typeof t === 'string') return t;
      out.push(t);
    }
  }
  return out;
}

export function shown(v: number): string {
  return String(Number(v.toPrecision(12)));
}

/**
 * Reads the data lines of one `(X++(Y..Y))` table as they come, without decoding them (the
 * package does that): counts the ordinates, and checks what JCAMP-DX puts in each line to
 * catch damage (McDonald & Wilks 1988): the x that starts the line against the header's
 * spacing, and, after a line ending in DIF form, that the next starts with a Y check value
 * (kept in {@link checks}, to hold against the decoded ordinate it repeats). A line that
 * could be read two ways (AFFN exponents among ASDF values, an AFFN value inside a DIF run, a
 * DUP with nothing to repeat) is a problem, not a guess.
 */
export class XyLines {
  /** Ordinates so far. */
  points = 0;
  readonly checks: Check[] = [];
  private form: Form = 'plain';
  private formLine = 0;
  /** True when the last line ended in DIF form, so that the next one starts with a Y check value. */
  private difEnd = false;

  constructor(private readonly spacing: Spacing) {}

  /** Reads one data line (its `$$` comment removed); returns what is wrong with it, or null. */
  row(line: number, data: string, rewrites: Map<number, string>): string | null {
    if (data.trim() === '') return null;
    const form = formOf(data);
    if (form !== 'plain' && this.form === 'plain') [this.form, this.formLine] = [form, line];
    else if (form !== 'plain' && form !== this.form) {
      const [affn, asdf] = form === 'exponent' ? [line, this.formLine] : [this.formLine, line];
      return `the table has AFFN numbers with an exponent (line ${affn}) and ASDF values (line ${asdf}), in which E and e are the digits +5 and −5; it cannot be read unambiguously`;
    }
    if (form === 'exponent') {
      const plain = data
        .trim()
        .split(/[\s,]+/)
        .map(plainDecimal);
      if (plain.includes(null)) return 'an exponent beyond ±400';
      rewrites.set(line, plain.join(' '));
    }
    const toks = tokens(data, form === 'exponent' ? EXPONENT_TOKEN : ASDF_TOKEN);
    if (typeof toks === 'string') return toks;
    const x = toks[0];
    if (x?.affn == null) return 'the line does not start with its x value in AFFN';
    const ys = toks.slice(1);
    if (ys.length === 0) return `the line holds an x value (${x.affn}) and no ordinates`;
    // After a line ending in DIF form the first ordinate repeats the last one before it (the Y check).
    const repeat = this.difEnd;
    if ((this.points === 0 || repeat) && ys[0]!.kind !== 'abs')
      return repeat
        ? 'the line after one ending in DIF form must start with the Y check value in SQZ or AFFN form'
        : 'the first ordinate of the table must be in SQZ or AFFN form, not DIF or DUP';
    const index = repeat ? this.points - 1 : this.points;
    const off = this.offAxis(x.affn, index);
    if (off !== null) return off;
    if (repeat) this.checks.push({ line, index, value: ys[0]!.value });
    let dif = false;
    let valued = false;
    for (let i = repeat ? 1 : 0; i < ys.length; i++) {
      const t = ys[i]!;
      if (t.kind === 'dup') {
        if (!valued) return 'a DUP count with no value of its own line before it to repeat';
        this.points += t.value - 1;
        continue;
      }
      // The package adds an unsigned AFFN value after DIF values as one more difference.
      if (dif && t.affn !== null && !t.affn.startsWith('-'))
        return `the AFFN value ${t.affn} follows DIF values on the line, which reads both as a value and as a difference`;
      dif = t.kind === 'dif';
      valued = true;
      this.points++;
    }
    this.difEnd = dif;
    return null;
  }

  /**
   * The line's x against the x of the point it starts at, by the header; null when within half a
   * point spacing plus half a unit in the last digit the line's x is written with. The
   * package places points by the header alone, so a line that disagrees means a lost or
   * shifted line, or a wrong header: either way the x axis read would be wrong.
   */
  private offAxis(written: string, index: number): string | null {
    const sp = this.spacing;
    const x = Number(written) * sp.factor;
    const expected = sp.first + index * sp.delta;
    const slack =
      Math.abs(sp.delta) / 2 +
      (resolution(written) * Math.abs(sp.factor)) / 2 +
      index * sp.slackPerPoint +
      1e-9 * (Math.abs(expected) + Math.abs(x));
    if (Math.abs(x - expected) <= slack) return null;
    return `the line starts at x = ${shown(x)} (after XFACTOR), where ${sp.from} put its first value, point ${index + 1}, at x = ${shown(expected)}; the data and the header disagree`;
  }
}
