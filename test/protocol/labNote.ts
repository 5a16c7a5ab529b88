/**
 * The lab note the protocol suites open: two spin runs, one of them with a
 * unit mistake (9.4 MT) and no lattice temperature. Line numbers are in the
 * comments; suites that need more blocks add them after `LAB_NOTE_LINES`.
 */
export const LAB_NOTE_LINES: readonly string[] = [
  '# Lab note', // 0
  '',
  '```levels', // 2
  'id: cell-B run 7', // 3
  'system: 13C', // 4
  'field: 7.05 T', // 5
  'lattice: 1.4 K', // 6
  'polarization: 0.312 ± 0.010', // 7
  '```', // 8
  '',
  '```levels', // 10
  'id: hurried', // 11
  'system: 1H', // 12
  'field: 9.4 MT', // 13
  'polarization: 0.001', // 14
  '```', // 15
  '',
];

/** Where the suites say the note lives. */
export const LAB_NOTE_URI = 'file:///notes/lab.md';
