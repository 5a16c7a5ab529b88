// The README inside the .vsix: VS Code shows it on the extension's page with
// the installed extension as its base, so a relative link works only if it
// names a file that is shipped. `packagedReadme` keeps those relative (they
// work offline) and points every other relative link at the repository, at
// the tag of the packaged version. Used by scripts/package.mjs; tested by
// test/client/readmeLinks.test.ts.
'use strict';

/** Inline links and images `[text](target "title")`, and reference definitions `[label]: target`. */
const LINK = /(\]\()(<[^>\n]*>|[^\s)]+)((?:\s+"[^"\n]*")?\))|^( {0,3}\[[^\]\n]+\]:[ \t]*)(<[^>\n]*>|\S+)/gm;

/** True for a target that leaves the file: a scheme (https:, mailto:, …) or an in-page anchor. */
function isRelative(target) {
  return !/^[a-z][a-z0-9+.-]*:/i.test(target) && !target.startsWith('#') && !target.startsWith('/');
}

/** The file part of a relative target: no angle brackets, fragment or query, `./` and percent-escapes resolved. */
function targetPath(target) {
  const bare = target.replace(/^<|>$/g, '').replace(/[?#].*$/, '');
  return decodeURIComponent(bare).replace(/^(\.\/)+/, '');
}

/**
 * The text with code blanked out (fenced blocks and inline code spans become
 * spaces, line breaks kept), so that link syntax shown as code is not taken
 * for a link; offsets stay those of the original.
 */
function maskCode(markdown) {
  const blank = (text) => text.replace(/[^\n]/g, ' ');
  const fenced = markdown.replace(
    /^( {0,3})(`{3,}|~{3,})[^\n]*\n[\s\S]*?(?:^ {0,3}\2[`~]*[ \t]*$|(?![\s\S]))/gm,
    (block) => blank(block),
  );
  return fenced.replace(/(`+)(?!`)[\s\S]*?[^`]\1(?!`)|(`+)(?!`)\2/g, (span) => blank(span));
}

/** The link matches outside code: [offset, the match's groups]. */
function links(markdown) {
  return [...maskCode(markdown).matchAll(LINK)].map((m) => {
    // Groups are read from the original text at the same offsets (masking keeps lengths).
    const original = markdown.slice(m.index, m.index + m[0].length);
    LINK.lastIndex = 0;
    const again = new RegExp(LINK.source, 'm').exec(original);
    return { index: m.index, length: m[0].length, groups: again ?? m };
  });
}

/** Every relative link target of a Markdown text (inline links, images and reference definitions), outside code. */
function relativeTargets(markdown) {
  const out = [];
  for (const { groups: m } of links(markdown)) {
    const target = m[2] ?? m[5];
    if (isRelative(target.replace(/^</, ''))) out.push(target);
  }
  return out;
}

/**
 * The README as packaged: relative links to shipped files (`shipped` holds the
 * .vsix listing; a folder counts when a shipped file lies in it) stay as they
 * are; the others become `<repository>/blob/v<version>/<path>` addresses.
 */
function packagedReadme(markdown, shipped, repository, version) {
  const files = new Set(shipped);
  const isShipped = (path) =>
    path === '' || files.has(path) || [...files].some((f) => f.startsWith(path.endsWith('/') ? path : `${path}/`));
  const base = `${repository.replace(/\.git$/, '').replace(/\/+$/, '')}/blob/v${version}/`;
  const absolute = (target) => {
    const bare = target.replace(/^<|>$/g, '');
    if (!isRelative(bare) || isShipped(targetPath(bare))) return target;
    return base + bare.replace(/^(\.\/)+/, '');
  };
  let out = '';
  let at = 0;
  for (const { index, length, groups: m } of links(markdown)) {
    const [, open, target, close, defStart, defTarget] = m;
    out += markdown.slice(at, index);
    out += open !== undefined ? `${open}${absolute(target)}${close}` : `${defStart}${absolute(defTarget)}`;
    at = index + length;
  }
  return out + markdown.slice(at);
}

/** The web address of package.json's `repository` (a string or `{ url }`), or null. */
function repositoryAddress(manifest) {
  const r = manifest.repository;
  const url = typeof r === 'string' ? r : r && typeof r.url === 'string' ? r.url : null;
  return url ? url.replace(/^git\+/, '').replace(/\.git$/, '') : null;
}

module.exports = { packagedReadme, relativeTargets, repositoryAddress, targetPath };
