// Types of readmeLinks.cjs (the README's links inside the .vsix).

/** The file part of a relative link target. */
export function targetPath(target: string): string;
/** Every relative link target of a Markdown text. */
export function relativeTargets(markdown: string): string[];
/** The README as packaged: links to unshipped files point at the repository at `v<version>`. */
export function packagedReadme(
  markdown: string,
  shipped: Iterable<string>,
  repository: string,
  version: string,
): string;
/** The web address of package.json's `repository`, or null. */
export function repositoryAddress(manifest: { repository?: string | { url?: string } }): string | null;
