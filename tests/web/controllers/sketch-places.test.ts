import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { parseTextMachine } from '../../../src/core/forms/text.js';
import { layoutDiagram, type DiagramLayout } from '../../../src/web/diagram/layout.js';
import { meanShift } from '../../../src/web/diagram/arrange.js';
import {
  parseShelf,
  shelfText,
  shelve,
  unshelve,
  SHELF_SIZE,
  type Shelf,
} from '../../../src/web/controllers/sketch-places.js';
import { NEW_MACHINE } from '../../../src/web/examples.js';
import { MemoryStorage } from './storage.support.js';

function laid(text: string): DiagramLayout {
  const r = parseTextMachine(text);
  if (!r.machine) throw new Error(r.diagnostics.map((d) => d.message).join('; '));
  return layoutDiagram(r.machine);
}

describe('src/web/controllers/sketch-places', () => {
  it('keeps places per machine in whole pixels, most recent first, and reads back what it wrote', () => {
    let shelf: Shelf = [];
    shelf = shelve(shelf, 'door', new Map([['shut', { x: 10.4, y: -3.6 }]]));
    shelf = shelve(shelf, 'bell', new Map([['rung', { x: 1, y: 2 }]]));
    const back = parseShelf(shelfText(shelf));
    if (!back) throw new Error('not read back');
    expect(back.map((a) => a.machine)).toEqual(['bell', 'door']);
    expect(unshelve(back, 'door')).toEqual(new Map([['shut', { x: 10, y: -4 }]]));
    // Another machine does not take them.
    expect(unshelve(back, 'lamp').size).toBe(0);
    // No places left: the machine goes off the shelf.
    expect(shelve(back, 'door', new Map()).map((a) => a.machine)).toEqual(['bell']);
    // Only the most recent machines are kept.
    for (let i = 0; i < SHELF_SIZE + 3; i++) shelf = shelve(shelf, `m${i}`, new Map([['a', { x: i, y: i }]]));
    expect(shelf).toHaveLength(SHELF_SIZE);
    expect(shelf[0].machine).toBe(`m${SHELF_SIZE + 2}`);
  });

  it('refuses a stored entry of another shape', () => {
    for (const bad of [
      '{',
      '{}',
      '[{"machine": 3, "at": {}}]',
      '[{"machine": "a", "at": {"s": [1]}}]',
      '[{"machine": "a", "at": {"s": [1, "2"]}}]',
      '[{"machine": "a", "at": []}]',
      JSON.stringify(Array.from({ length: SHELF_SIZE + 1 }, (_, i) => ({ machine: `m${i}`, at: {} }))),
    ])
      expect(parseShelf(bad), bad).toBeUndefined();
    expect(parseShelf('[]')).toEqual([]);
  });

  describe('SketchPlaces (with a storage held in memory)', () => {
    let store: MemoryStorage;
    beforeEach(() => {
      store = new MemoryStorage();
      Object.defineProperty(globalThis, 'localStorage', { value: store, configurable: true });
      vi.resetModules();
    });
    afterEach(() => {
      Reflect.deleteProperty(globalThis, 'localStorage');
    });

    it('survives a reload (the module read anew from storage), and puts every state back on reset', async () => {
      const l = laid(NEW_MACHINE);
      const first = await import('../../../src/web/controllers/sketch-places.js');
      const a = new first.SketchPlaces();
      a.open('new_machine', l);
      a.move('lit', { x: 300, y: 40 }, false);
      expect(store.items.size).toBe(0);
      a.move('lit', { x: 310, y: 44 });
      expect(JSON.parse(store.items.get('latchwright.places') ?? '')).toEqual([
        { machine: 'new_machine', at: { lit: [310, 44] } },
      ]);
      vi.resetModules();
      const again = await import('../../../src/web/controllers/sketch-places.js');
      const b = new again.SketchPlaces();
      b.open('new_machine', l);
      expect(b.places).toEqual(new Map([['lit', { x: 310, y: 44 }]]));
      const other = new again.SketchPlaces();
      other.open('another', l);
      expect(other.places.size).toBe(0);
      b.reset();
      expect(b.places.size).toBe(0);
      expect(store.items.has('latchwright.places')).toBe(false);
    });

    it('places a state asked for at a spot once the layout has it, moved with the layout', async () => {
      const { SketchPlaces } = await import('../../../src/web/controllers/sketch-places.js');
      const before = laid(NEW_MACHINE);
      const after = laid(`${NEW_MACHINE}\nstate ringing\n`);
      const a = new SketchPlaces();
      a.open('new_machine', before);
      a.expect('ringing', { x: 20, y: 200 });
      // A layout made before the new state is in the text leaves it waiting.
      expect(a.follow(before, before)).toBeUndefined();
      expect(a.follow(before, after)).toBe('ringing');
      const s = meanShift(before, after);
      // Kept in whole pixels, as stored.
      expect(a.places.get('ringing')).toEqual({ x: Math.round(20 + s.x), y: Math.round(200 + s.y) });
      expect(parseShelf(store.items.get('latchwright.places') ?? '')?.[0].machine).toBe('new_machine');
    });

    it('takes the places along when the machine is renamed in its text, and not to another machine', async () => {
      const { SketchPlaces } = await import('../../../src/web/controllers/sketch-places.js');
      const l = laid(NEW_MACHINE);
      const a = new SketchPlaces();
      a.open('new_machine', l);
      a.move('lit', { x: 300, y: 40 });
      // The name line edited, a keystroke at a time: the same states under each new name.
      a.open('new_machin', l, l);
      a.open('lamp_post', l, l);
      expect(a.places).toEqual(new Map([['lit', { x: 300, y: 40 }]]));
      // One entry, under the name the machine has now: the names typed on the way leave nothing.
      expect(parseShelf(store.items.get('latchwright.places') ?? '')?.map((x) => x.machine)).toEqual(['lamp_post']);
      // Another machine on the bench (other states) starts from the layout, and the renamed one keeps its places.
      const other = laid(`${NEW_MACHINE}\nstate ringing\n`);
      a.open('bell_tower', other, l);
      expect(a.places.size).toBe(0);
      a.open('lamp_post', l, other);
      expect(a.places).toEqual(new Map([['lit', { x: 300, y: 40 }]]));
      // A name that has its own places keeps them, even with the same states.
      const b = new SketchPlaces();
      b.open('twin', l);
      b.move('lit', { x: 5, y: 6 });
      b.open('lamp_post', l, l);
      expect(b.places).toEqual(new Map([['lit', { x: 300, y: 40 }]]));
    });
  });
});
