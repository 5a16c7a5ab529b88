import { readFileSync } from 'node:fs';
import { readSpectrum } from './src/core';
const src = readFileSync('test/robustness/spectra.test.ts', 'utf8');
const m = /const JCAMP = \[([\s\S]*?)\]\.join/.exec(src)!;
const text = (eval('[' + m[1] + ']') as string[]).join('\n');
const r = readSpectrum(text, 'a.jdx');
console.log(r.ok ? [...r.spectrum.y] : r);
