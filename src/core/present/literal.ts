/**
 * Note text made literal for the outputs that would otherwise interpret it:
 * a terminal (control characters) and Markdown (links, images, emphasis,
 * code spans, HTML, tables). A block id, a file name or a message quoting a
 * key comes from the note, and a note is untrusted: it must not clear the
 * screen, plant a hyperlink, or load a remote image into a summary.
 */

/**
 * The C0 controls (U+0000–U+001F), DEL (U+007F) and the C1 controls
 * (U+0080–U+009F) of ECMA-48 §5 / ISO/IEC 6429: ESC and CSI start escape and
 * control sequences (colours, cursor moves, screen clearing, OSC 8
 * hyperlinks), BEL rings, and C1 has single-byte forms of the same.
 */
// Matching control characters is the point here (ECMA-48 C0, DEL, C1).
// eslint-disable-next-line no-control-regex
const CONTROLS = /[\u0000-\u001f\u007f-\u009f]/g;

/**
 * The invisible format characters that reorder or hide text on a display
 * (Unicode Standard Annex #9, the bidirectional algorithm: the embeddings
 * and overrides U+202A–U+202E, the isolates U+2066–U+2069 and the marks
 * U+200E, U+200F, U+061C), and the zero-width space, word joiner and byte
 * order mark (U+200B, U+2060, U+FEFF): an id written `safe\u202Egnp.exe`
 * would show as `safeexe.png`. The zero-width joiner and non-joiner stay:
 * scripts and emoji need them.
 */
const INVISIBLE = /[\u061c\u200b\u200e\u200f\u202a-\u202e\u2060\u2066-\u2069\ufeff]/g;

/** Every control character but tab, LF and CR, which a CSV field may hold quoted. */
// eslint-disable-next-line no-control-regex
const CONTROLS_BUT_BREAKS = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/g;

/**
 * Text for a file that may be printed on a terminal or opened in another
 * program (a CSV): control characters but tab, LF and CR removed, and the
 * invisible characters that reorder or hide text.
 */
export function withoutControls(text: string): string {
  return text.replace(CONTROLS_BUT_BREAKS, '').replace(INVISIBLE, '');
}

/** Tab and line breaks, which would break a line or a table cell apart. */
const BREAKS = /[\t\n\v\f\r\u0085\u2028\u2029]/g;

/**
 * Text to print on a terminal: tabs and line breaks become spaces and every
 * other control character is removed, so what is printed is only the text
 * (the printable rest of an escape sequence, such as `[2J`, stays visible
 * and harmless).
 */
export function terminalText(text: string): string {
  return text.replace(BREAKS, ' ').replace(CONTROLS, '').replace(INVISIBLE, '');
}

/**
 * ASCII punctuation, every character of which CommonMark lets a backslash
 * escape (CommonMark 0.31.2 §2.4): escaping them all leaves no `[` `]` `(`
 * for a link or image, no `*` `_` `~` for emphasis, no `` ` `` for a code
 * span, no `<` for HTML or an autolink, no `&` for an entity, no `|` for a
 * table cell (GFM 0.29 §4.10), and no `:` or `.` for an extended autolink
 * such as `http://…` or `www.…` (GFM §6.9).
 */
const PUNCTUATION = /[!-/:-@[-`{-~]/g;

/**
 * Note text as literal Markdown inline text, safe inside a GFM table cell:
 * one line, no control characters, every ASCII punctuation character
 * backslash-escaped. A renderer shows exactly the text.
 */
export function markdownText(text: string): string {
  return terminalText(text).replace(PUNCTUATION, (c) => `\\${c}`);
}

/**
 * Note text as a Markdown code span inside a GFM table cell: fenced with one
 * backtick more than the longest run of backticks in it (CommonMark §6.1),
 * padded with a space where it starts or ends with a backtick or a space (the
 * renderer strips one space from each side), and with `|` escaped, which GFM
 * requires even inside a code span in a table (GFM §4.10; the table removes
 * the backslash before the span is read).
 */
export function markdownCode(text: string): string {
  const line = terminalText(text);
  if (line === '') return '';
  let longest = 0;
  for (const run of line.match(/`+/g) ?? []) longest = Math.max(longest, run.length);
  const fence = '`'.repeat(longest + 1);
  const pad = /^[` ]|[` ]$/.test(line) ? ' ' : '';
  return `${fence}${pad}${line.replace(/\|/g, '\\|')}${pad}${fence}`;
}
