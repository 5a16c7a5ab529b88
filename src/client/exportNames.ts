/**
 * Names and links of the curve view's exports, as pure functions (no vscode
 * import, so plain tests run them): the file-name stem from a block id, the
 * PNG bytes of a data URL, and the Markdown image link from a note to a saved
 * image.
 */

/** The parts of a URI that decide a relative link. */
export interface UriParts {
  readonly scheme: string;
  readonly authority: string;
  readonly path: string;
  toString(): string;
}

/** A file-name stem from a block id: letters, digits, `_` and `-` only, at most 60 characters. */
export function fileStem(id: string): string {
  const stem = id
    .normalize('NFKD')
    .replace(/[^\w-]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .toLowerCase();
  return (stem || 'block').slice(0, 60);
}

/** The bytes of a `data:image/png;base64,` URL (already validated by the message check). */
export function pngBytes(dataUrl: string): Uint8Array {
  // atob exists in Node.js and browsers alike (the extension also runs in a web worker, where Buffer does not).
  const binary = atob(dataUrl.slice(dataUrl.indexOf(',') + 1));
  const bytes = new Uint8Array(binary.length);
  for (let i = 0; i < binary.length; i++) bytes[i] = binary.charCodeAt(i);
  return bytes;
}

/** Escapes text for a Markdown image's alt text (brackets, backslashes, line breaks). */
export function altText(id: string): string {
  return id.replace(/[\\[\]]/g, '\\$&').replace(/[\r\n]+/g, ' ');
}

/**
 * The Markdown image link from a note to an image: a relative path when both
 * have the same scheme and authority, the full URI otherwise; in angle
 * brackets when the target holds spaces or parentheses (CommonMark's form for
 * such link destinations).
 */
export function imageLink(note: UriParts, image: UriParts, id: string): string {
  let target = image.toString();
  if (note.scheme === image.scheme && note.authority === image.authority) {
    const from = note.path.split('/').filter(Boolean).slice(0, -1);
    const to = image.path.split('/').filter(Boolean);
    let common = 0;
    while (common < from.length && common < to.length - 1 && from[common] === to[common]) common++;
    target = [...from.slice(common).map(() => '..'), ...to.slice(common)].join('/');
  }
  const safe = /[\s()<>]/.test(target) ? `<${target.replace(/[<>]/g, encodeURIComponent)}>` : target;
  return `![${altText(id)}](${safe})`;
}
