/**
 * Latches, transfer gates and the reset cords (design §5).
 * Per state bit j: master M_j and slave Q_j, each two cross-coupled gates. The set-side gate
 * outputs Q and carries the S̄ port(s) plus a feedback port tied to Q̄; the reset-side gate
 * outputs Q̄ and carries R̄ plus a feedback port tied to Q. Master S̄/R̄ take the cords of the
 * set/reset term gates directly (a port is a wired-AND, so S̄ = NOT(OR of terms)); the slave
 * takes NAND(φ2, M_j) on S̄ and NAND(φ2, M̄_j) on R̄. The reset driver's cord goes to S̄ of
 * every latch whose start-code bit is 1 and to R̄ of every other one.
 */
import { capacity, fitAnd } from './fan-in.js';
import { ids } from './names.js';
import type { MapContext } from './terms.js';

/** Build both latches of every bit and the transfer gates between them. */
export function buildLatches(ctx: MapContext, startCode: string, feeds: readonly (readonly string[])[]): void {
  for (let j = 0; j < ctx.bits; j++) {
    const one = startCode[j] === '1';
    const rstSet = one ? [ids.resetDriver] : [];
    const rstReset = one ? [] : [ids.resetDriver];
    const m = ids.master(j),
      s = ids.slave(j);
    latch(ctx, m, `master latch M${j}`, 'master', j, [...feeds[2 * j], ...rstSet], [...feeds[2 * j + 1], ...rstReset]);
    latch(
      ctx,
      s,
      `slave latch Q${j}`,
      'slave',
      j,
      [ids.transferSet(j), ...rstSet],
      [ids.transferReset(j), ...rstReset],
    );
    ctx.b.gate(ids.transferSet(j), `transfer φ2 M${j} → set Q${j}`, 'transfer', [
      { prefix: 'p', drivers: [ids.phi2, ids.setGate(m)] },
    ]);
    ctx.b.gate(ids.transferReset(j), `transfer φ2 !M${j} → reset Q${j}`, 'transfer', [
      { prefix: 'p', drivers: [ids.phi2, ids.resetGate(m)] },
    ]);
  }
}

function latch(
  ctx: MapContext,
  id: string,
  name: string,
  role: 'master' | 'slave',
  bit: number,
  set: string[],
  reset: string[],
): void {
  const sg = ids.setGate(id),
    rg = ids.resetGate(id);
  ctx.b.latch(id, name, role, bit, sg, rg);
  // One port is kept for the feedback cord; the rest take the set (reset) cords.
  const slots = capacity(ctx.b, ctx.b.profile.maxPortsPerGate - 1);
  const sd = fitAnd(ctx.b, sg, 'term', set, slots);
  const rd = fitAnd(ctx.b, rg, 'term', reset, slots);
  ctx.b.gate(
    sg,
    `${name} set side (Q)`,
    'latch-set',
    [
      { prefix: 's', drivers: sd },
      { prefix: 'fb', single: 'fb', drivers: [rg] },
    ],
    id,
  );
  ctx.b.gate(
    rg,
    `${name} reset side (Q̄)`,
    'latch-reset',
    [
      { prefix: 'r', drivers: rd },
      { prefix: 'fb', single: 'fb', drivers: [sg] },
    ],
    id,
  );
}
