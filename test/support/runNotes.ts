/**
 * The notes the runs-by-reference suites share: a day's thermal reference
 * block and hyperpolarized runs that take it by reference. Invented numbers:
 * they exercise the references (the physics is checked in
 * test/core/runs/physics.test.ts against hand computations).
 */

/** A `levels` fence around a body. */
export const fence = (body: string): string => '```levels\n' + body + '\n```\n';

/** The Monday ¹³C thermal reference (256 scans, noise 12), under the id given. */
export const refBlock = (id = 'ref-13C Monday'): string =>
  fence(`id: ${id}
date: 2026-04-12
system: 13C
field: 9.4 T
lattice: 298 K
signal:
  thermal: 1.08e3
  scans: { thermal: 256 }
  noise: { thermal: 12 }`);

/** A hyperpolarized run (5 deg flip) taking its thermal side from `ref`; `extra` lines go after the signal. */
export const hpBlock = (id: string, ref: string, extra = ''): string =>
  fence(`id: ${id}
system: 13C
field: 9.4 T
signal:
  hyperpolarized: 2.985e4
  thermal: { run: ${ref} }
  flip: { hyperpolarized: 5 deg }${extra ? '\n' + extra : ''}`);

/** A reference of 16 scans at 298.15 K, for the suites that check wording and the command line. */
export const dayRefBlock = (id = 'ref-13C Monday'): string =>
  fence(`id: ${id}
date: 2026-04-12
system: 13C
field: 9.4 T
lattice: 298.15 K
signal:
  thermal: 1.08e3
  scans: { thermal: 16 }`);

/** A run taking its thermal side from `ref` and carried back from 42 s to 0 s along a typed T₁. */
export const extrapolatedRun = (id: string, ref: string): string =>
  hpBlock(id, ref, 'extrapolate: { from: 42 s, to: 0 s, decay: 47.9 ± 1.2 s }');
