/**
 * Whether a block body (or a Markdown text holding blocks) may take values from outside: another run or a
 * spectrum file. Only those need sources; a module of its own, without the core, so that the extension's own
 * bundle can ask it without loading the note reader.
 */
export function refersOut(text: string): boolean {
  return text.includes('run:') || text.includes('spectrum');
}
