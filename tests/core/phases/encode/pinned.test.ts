import { describe, expect, it } from 'vitest';
import { encode } from '../../../../src/core/phases/encode/index.js';
import { ring } from './machines.js';

describe('core/phases/encode/pinned', () => {
  const full = { s0: '00', s1: '01', s2: '11', s3: '10' };

  it('takes every code from the user', () => {
    const r = encode(ring(4), 'pinned', { pinned: full });
    expect(r.diagnostics).toEqual([]);
    expect(r.encoding).toEqual({ strategy: 'pinned', bits: 2, codes: ['00', '01', '11', '10'] });
  });

  it('reports LW701 naming the states that have no code', () => {
    const r = encode(ring(4), 'pinned', { pinned: { s0: '00', s2: '11' } });
    expect(r.encoding).toBeUndefined();
    expect(r.diagnostics).toHaveLength(1);
    expect(r.diagnostics[0].code).toBe('LW701');
    expect(r.diagnostics[0].message).toContain("'s1', 's3'");
    expect(r.diagnostics[0].hint).toBeDefined();
  });

  it("reports LW206 for characters other than 0 and 1, at the pin's location", () => {
    const r = encode(ring(4), 'pinned', {
      pinned: { ...full, s1: '0x' },
      pinnedAt: { s1: { file: 'bell.lw', line: 7, column: 3 } },
    });
    expect(r.encoding).toBeUndefined();
    expect(r.diagnostics.map((d) => d.code)).toEqual(['LW206']);
    expect(r.diagnostics[0].message).toContain("'s1'");
    expect(r.diagnostics[0].location).toEqual({ file: 'bell.lw', line: 7, column: 3 });
  });

  it('reports LW206 for a code of another length, naming the state that set the length', () => {
    const r = encode(ring(4), 'binary', { pinned: { s0: '00', s3: '100' } });
    expect(r.encoding).toBeUndefined();
    expect(r.diagnostics.map((d) => d.code)).toEqual(['LW206']);
    expect(r.diagnostics[0].message).toMatch(/'s3'.*'s0'/);
  });

  it('reports LW206 for two states pinned to one code, naming both', () => {
    const r = encode(ring(4), 'gray', { pinned: { s1: '10', s2: '10' } });
    expect(r.encoding).toBeUndefined();
    expect(r.diagnostics.map((d) => d.code)).toEqual(['LW206']);
    expect(r.diagnostics[0].message).toContain("'s1' and 's2'");
  });

  it('warns (LW207) about a pin for a state the machine does not have, and carries on', () => {
    const r = encode(ring(4), 'binary', { pinned: { s9: '11' } });
    expect(r.diagnostics.map((d) => [d.code, d.severity])).toEqual([['LW207', 'warning']]);
    expect(r.encoding?.codes).toEqual(['00', '01', '10', '11']);
  });

  it('is honoured by every strategy that fits around it', () => {
    for (const s of ['binary', 'gray', 'one-hot', 'auto'] as const) {
      const pin = s === 'one-hot' ? '0000' : '10';
      const r = encode(ring(4), s, { pinned: { s3: pin } });
      expect(r.encoding?.codes[3], s).toBe(pin);
      expect(new Set(r.encoding?.codes).size, s).toBe(4);
    }
  });
});
