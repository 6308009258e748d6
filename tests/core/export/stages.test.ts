import { describe, expect, it } from 'vitest';
import type { Netlist } from '../../../src/core/model/netlist.js';
import { stagesOf } from '../../../src/core/export/stages.js';

describe('core/export/stages', () => {
  // A hand-made netlist: an input inverter, a term gate narrowed by a fan-in stage (NAND + inverter),
  // a buffer pair on the φ1 cord, a master latch, a transfer gate, a slave latch, an output gate and a flag.
  const n: Netlist = {
    parts: [
      { kind: 'flag', id: 'flag.z', name: '', output: 'z', gate: 'o.z', inverted: false },
      { kind: 'gate', id: 'o.z', name: '', role: 'output', ports: [{ name: 'p1' }] },
      { kind: 'gate', id: 's0.set', name: '', role: 'latch-set', ports: [{ name: 's1' }, { name: 'fb' }], latch: 's0' },
      { kind: 'latch', id: 's0', name: '', role: 'slave', bit: 0, setGate: 's0.set', resetGate: 's0.set' },
      { kind: 'gate', id: 'tr0.set', name: '', role: 'transfer', ports: [{ name: 'p1' }] },
      { kind: 'latch', id: 'm0', name: '', role: 'master', bit: 0, setGate: 'm0.set', resetGate: 'm0.set' },
      { kind: 'gate', id: 'm0.set', name: '', role: 'latch-set', ports: [{ name: 's1' }, { name: 'fb' }], latch: 'm0' },
      { kind: 'gate', id: 't.S0.1', name: '', role: 'term', ports: [{ name: 'p1' }] },
      { kind: 'gate', id: 't.S0.1.and1.inv', name: '', role: 'inverter', ports: [{ name: 'p1' }] },
      { kind: 'gate', id: 't.S0.1.and1', name: '', role: 'term', ports: [{ name: 'p1' }] },
      { kind: 'gate', id: 'buf.b', name: '', role: 'buffer', ports: [{ name: 'in' }] },
      { kind: 'gate', id: 'buf.a', name: '', role: 'buffer', ports: [{ name: 'in' }] },
      { kind: 'gate', id: 'x.a.inv', name: '', role: 'inverter', ports: [{ name: 'p1' }] },
      { kind: 'lever', id: 'clk.phi1', name: '', role: 'phi1' },
      { kind: 'lever', id: 'in.a', name: '', role: 'input', input: 'a' },
    ],
    cords: [
      {
        id: 'c1',
        driver: 'in.a',
        ports: [
          { part: 'x.a.inv', port: 'p1' },
          { part: 't.S0.1.and1', port: 'p1' },
        ],
        actuators: [],
      },
      { id: 'c2', driver: 'clk.phi1', ports: [{ part: 'buf.a', port: 'in' }], actuators: [] },
      { id: 'c3', driver: 'buf.a', ports: [{ part: 'buf.b', port: 'in' }], actuators: [] },
      { id: 'c4', driver: 'buf.b', ports: [{ part: 't.S0.1', port: 'p1' }], actuators: [] },
      { id: 'c5', driver: 't.S0.1.and1', ports: [{ part: 't.S0.1.and1.inv', port: 'p1' }], actuators: [] },
      { id: 'c6', driver: 't.S0.1.and1.inv', ports: [{ part: 't.S0.1', port: 'p1' }], actuators: [] },
      { id: 'c7', driver: 't.S0.1', ports: [{ part: 'm0.set', port: 's1' }], actuators: [] },
      { id: 'c8', driver: 'm0.set', ports: [{ part: 'tr0.set', port: 'p1' }], actuators: [] },
      { id: 'c9', driver: 'tr0.set', ports: [{ part: 's0.set', port: 's1' }], actuators: [] },
      {
        id: 'c10',
        driver: 's0.set',
        ports: [
          { part: 'o.z', port: 'p1' },
          { part: 't.S0.1.and1', port: 'p1' },
        ],
        actuators: [],
      },
    ],
  };

  it('puts each part in its stage; helper gates take the stage of what feeds them', () => {
    const s = stagesOf(n);
    expect(Object.fromEntries(s.stage)).toEqual({
      'flag.z': 'indicator',
      'o.z': 'output',
      's0.set': 'slave',
      s0: 'slave',
      'tr0.set': 'transfer',
      m0: 'master',
      'm0.set': 'master',
      't.S0.1': 'term',
      't.S0.1.and1.inv': 'term',
      't.S0.1.and1': 'term',
      'buf.b': 'lever',
      'buf.a': 'lever',
      'x.a.inv': 'input-inverter',
      'clk.phi1': 'lever',
      'in.a': 'lever',
    });
  });

  it('orders by stage, then by netlist position', () => {
    const s = stagesOf(n);
    const ids = n.parts.map((p) => p.id).sort((a, b) => s.compare(a, b));
    expect(ids).toEqual([
      'buf.b',
      'buf.a',
      'clk.phi1',
      'in.a',
      'x.a.inv',
      't.S0.1',
      't.S0.1.and1.inv',
      't.S0.1.and1',
      'm0',
      'm0.set',
      'tr0.set',
      's0.set',
      's0',
      'o.z',
      'flag.z',
    ]);
  });
});
