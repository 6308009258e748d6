/** The example machines shipped with the tool (examples/*.lw), offered on the bench. */
import crossing from '../../examples/crossing.lw?raw';
import lighthouse from '../../examples/lighthouse.lw?raw';
import marbleBell from '../../examples/marble-bell.lw?raw';
import oddLever from '../../examples/odd-lever.lw?raw';
import sequenceLock from '../../examples/sequence-lock.lw?raw';

export interface Example {
  readonly file: string;
  readonly title: string;
  readonly text: string;
}

export const EXAMPLES: readonly Example[] = [
  { file: 'marble-bell.lw', title: 'Marble bell (every third marble)', text: marbleBell },
  { file: 'sequence-lock.lw', title: 'Sequence lock (green, red, blue)', text: sequenceLock },
  { file: 'crossing.lw', title: 'Level crossing with a call button', text: crossing },
  { file: 'lighthouse.lw', title: 'Lighthouse, group flashing two', text: lighthouse },
  { file: 'odd-lever.lw', title: 'Odd one out (two levers, one chime)', text: oddLever },
];

/** The machine a new visitor finds on the bench. */
export const FIRST_EXAMPLE = EXAMPLES[0];

/** What New puts on the bench: a small machine to write over, every line explained. */
export const NEW_MACHINE = `# A new machine. A line starting with # is a comment.
# The notation card (Ctrl+/ or the Notation button) lists every statement.

machine new_machine
inputs button        # levers a person, a marble or a sensor pulls
outputs lamp         # flags or actuators the machine shows

start dark           # the state it starts in, and returns to on reset

state dark
  when button go lit # at a clock with button pulled, go to lit

state lit with lamp=1
  when button go dark
`;
