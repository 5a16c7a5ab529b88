/** A note for the run comparison tests (invented runs, as the demo's). */

/** A DNP run log written as a lab would: four ¹³C runs over three days (two on one day), one inverted. */
export const RUN_LOG_NOTE = [
  '# Polarizer runs',
  '',
  ...[
    ['run 1', '2026-03-09', '0.312 ± 0.010'],
    ['run 2', '2026-03-10', '0.180 ± 0.012'],
    ['run 3', '2026-03-10', '0.050 ± 0.010'],
    ['run 4', '2026-03-12', '-0.120 ± 0.010'],
  ].flatMap(([id, date, p]) => [
    '```levels',
    `id: ${id}`,
    'system: 13C',
    'field: 7.05 T',
    'lattice: 1.4 K',
    `polarization: ${p}`,
    `date: ${date}`,
    '```',
    '',
  ]),
].join('\n');
