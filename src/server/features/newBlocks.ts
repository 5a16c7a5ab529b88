/**
 * The new-block snippets of completion, offered outside blocks at a line
 * start (optionally after a typed fence); plain text for a client without
 * snippet support.
 */
import { CompletionItemKind, InsertTextFormat, type CompletionItem, type Position } from 'vscode-languageserver';
import { back } from '../state';

/**
 * The new-block templates. Every value is a placeholder word, never a plausible number: a template
 * left as inserted must show errors, not quietly record a run nobody measured.
 */
const TEMPLATES: readonly { readonly label: string; readonly detail: string; readonly body: readonly string[] }[] = [
  {
    label: 'levels block',
    detail: 'a spin in a field, with its polarization',
    body: [
      'id: ${1:run name}',
      'system: ${2:isotope}',
      'field: ${3:field with unit}',
      'lattice: ${4:bath temperature with unit}',
      'polarization: ${5:measured P}',
    ],
  },
  {
    label: 'levels block (transition)',
    detail: 'a single transition with degeneracies',
    body: [
      'id: ${1:line name}',
      'gap: ${2:energy or wavelength with unit}',
      'g: [${3:g lower}, ${4:g upper}]',
      'ratio: ${5:n upper / n lower}',
    ],
  },
  {
    label: 'levels block (explicit levels)',
    detail: 'levels with energies, degeneracies and populations',
    body: [
      'id: ${1:scheme name}',
      'levels:',
      '  - { label: ${2:lower}, energy: ${3:energy with unit}, g: ${4:g}, population: ${5:n} }',
      '  - { label: ${6:upper}, energy: ${7:energy with unit}, g: ${8:g}, population: ${9:n} }',
    ],
  },
];

/** Snippets for a new block, offered at a line start (optionally after a typed fence). */
export function snippetItems(position: Position, before: string, snippets: boolean): CompletionItem[] {
  const m = /^ {0,3}((`{1,3}|~{1,3})?[A-Za-z-]*)$/.exec(before);
  if (!m) return [];
  const fence = m[2]?.startsWith('~') ? '~~~' : '```';
  return TEMPLATES.map((t, i) => {
    const text = [`${fence}levels`, ...t.body, fence].join('\n');
    return {
      label: t.label,
      kind: CompletionItemKind.Snippet,
      detail: t.detail,
      insertTextFormat: snippets ? InsertTextFormat.Snippet : InsertTextFormat.PlainText,
      textEdit: { range: back(position, m[1].length), newText: snippets ? text : plainSnippet(text) },
      filterText: `${m[2] ?? ''}${t.label}`,
      sortText: String(i),
    };
  });
}

/**
 * A snippet as plain text (LSP 3.17 snippet syntax): each placeholder
 * `${n:default}` becomes its default, and tab stops `$n` / `${n}` vanish.
 * The templates hold no nested placeholders, choices or escaped `$`.
 */
export function plainSnippet(snippet: string): string {
  return snippet.replace(/\$\{\d+:([^}]*)\}/g, '$1').replace(/\$\{\d+\}|\$\d+/g, '');
}
