/**
 * The timing diagram's data: one trace per input lever, φ1, φ2, reset, slave bit (Q), master
 * bit (M) and output, with its value after every hand action of the trial run.
 */
import type { Sample } from './stepper.js';

/** One trace: a name and its value after each sample ('0', '1' or 'X'). */
export interface Trace {
  readonly name: string;
  readonly group: 'input' | 'clock' | 'bit' | 'output';
  readonly values: readonly string[];
}

/** The traces of a run. */
export function tracesOf(samples: readonly Sample[]): Trace[] {
  if (samples.length === 0) return [];
  const r0 = samples[0].reading;
  const bits = r0.code.length;
  const t = (name: string, group: Trace['group'], f: (s: Sample) => string): Trace => ({
    name,
    group,
    values: samples.map(f),
  });
  return [
    ...Object.keys(r0.inputs).map((n) => t(n, 'input', (s) => String(s.reading.inputs[n] ?? 0))),
    t('φ1', 'clock', (s) => (s.reading.phi1 ? '1' : '0')),
    t('φ2', 'clock', (s) => (s.reading.phi2 ? '1' : '0')),
    t('reset', 'clock', (s) => (s.reading.reset ? '1' : '0')),
    ...Array.from({ length: bits }, (_, b) => t(`Q${b}`, 'bit', (s) => s.reading.code[b] ?? 'X')),
    ...Array.from({ length: bits }, (_, b) => t(`M${b}`, 'bit', (s) => s.reading.masterCode[b] ?? 'X')),
    ...Object.keys(r0.outputs).map((o) => t(o, 'output', (s) => s.reading.outputs[o] ?? 'X')),
  ];
}
