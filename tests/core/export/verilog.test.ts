import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { commissioningTour } from '../../../src/core/export/tour.js';
import { verilogFiles } from '../../../src/core/export/verilog.js';
import { evilBuild, example, exampleNames } from './support.js';

const work = mkdtempSync(join(tmpdir(), 'lw-verilog-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

/**
 * Compile the module and its testbench with Icarus Verilog (Debian package `iverilog`, an
 * independent IEEE 1364 simulator) and run the testbench; returns what it printed.
 */
function simulate(b: Build, tag: string): string {
  const v = verilogFiles(b, DEFAULT_PROFILE, commissioningTour(b.machine));
  const dir = mkdtempSync(join(work, `${tag}-`));
  writeFileSync(join(dir, 'machine.v'), v.module);
  writeFileSync(join(dir, 'machine_tb.v'), v.testbench);
  execFileSync(
    'iverilog',
    ['-g2005', '-Wall', '-o', join(dir, 'sim'), join(dir, 'machine.v'), join(dir, 'machine_tb.v')],
    { stdio: 'pipe' },
  );
  return execFileSync('vvp', ['-n', join(dir, 'sim')], { encoding: 'utf8', timeout: 60_000 });
}

describe('core/export/verilog', () => {
  // Icarus Verilog as an independent simulator checking our netlist against the state table.
  it('every example, built as the CLI builds it, compiles under Icarus Verilog and its testbench passes', () => {
    for (const name of exampleNames()) {
      const out = simulate(example(name, 'auto').build, name.replace('.lw', ''));
      expect(out, name).toContain('PASS');
      expect(out, name).not.toContain('FAIL');
    }
  });

  it('the testbench catches a miswired build (Icarus Verilog prints FAIL)', () => {
    const b = example('marble-bell.lw').build;
    // Cut the first term gate's cord off its first port: that latch input is never pulled.
    const first = b.netlist.cords.find((c) => c.driver.startsWith('t.'));
    const cut: Build = {
      ...b,
      netlist: {
        ...b.netlist,
        cords: b.netlist.cords.map((c) => (c === first ? { ...c, ports: c.ports.slice(1) } : c)),
      },
    };
    const out = simulate(cut, 'cut');
    expect(out).toMatch(/FAIL clock \d+: state code is/);
    expect(out).toMatch(/FAIL \d+ mismatches/);
    expect(out).not.toMatch(/^PASS$/m);
  });

  it('writes one nand per gate, levers as inputs, outputs as outputs, a flag as an and of its gate’s inputs', () => {
    const b = example('marble-bell.lw').build;
    const v = verilogFiles(b, DEFAULT_PROFILE, commissioningTour(b.machine));
    const gates = b.netlist.parts.filter((p) => p.kind === 'gate').length;
    expect(v.module.match(/^\s+nand #\(STAGE\) u_/gm)).toHaveLength(gates);
    expect(v.module).toContain('module lw_marble_bell #(parameter STAGE = 250000) (');
    expect(v.module).toMatch(
      /input wire in_marble,\n\s+input wire phi1,\n\s+input wire phi2,\n\s+input wire reset,\n\s+output wire out_bell/,
    );
    expect(v.module).toMatch(/and #\(STAGE\) f_flag_bell \(out_bell, g_s0_set, g_s1_set\);/);
    expect(v.module).toContain('//   g_t_S0_1 = output of gate t.S0.1');
    expect(v.testbench).toContain('$finish;');
    expect(v.moduleName).toBe('lw_marble_bell');
    expect(v.testbenchName).toBe('lw_marble_bell_tb');
  });

  it('sanitises names with quotes, <, & and formula characters, and still passes', () => {
    const b = evilBuild().build;
    const v = verilogFiles(b, DEFAULT_PROFILE, commissioningTour(b.machine));
    for (const text of [v.module, v.testbench]) {
      expect(text).not.toMatch(/[^\x09\x0a\x20-\x7e]/);
      for (const line of text.split('\n')) {
        // Outside comments and string literals, no trace of the names' special characters.
        const code = line.replace(/\/\/.*$/, '').replace(/"(?:[^"\\]|\\.)*"/g, '""');
        expect(code, line).not.toMatch(/[<>&|]|=cmd|\+rung/);
      }
    }
    const out = simulate(b, 'evil');
    expect(out).toContain('PASS');
  });
});
