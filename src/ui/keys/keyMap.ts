/**
 * Every key of the workbench in one place: the keyboard handler, the help
 * overlay and the tests all read this list. Keys are KeyboardEvent.key
 * values. The spectrum plot's own keys (zoom, pan, reset) are in PLOT_KEYS
 * and work while the plot has focus.
 */
import { FLAGS } from '../review/flags';

export type ActionId =
  | 'next'
  | 'previous'
  | 'nextUnreviewed'
  | 'accept'
  | 'reject'
  | 'reopen'
  | 'candidate'
  | 'bestOfClass'
  | 'refine'
  | 'compare'
  | 'flag'
  | 'jump'
  | 'typeZ'
  | 'nameLine'
  | 'grade'
  | 'note'
  | 'filter'
  | 'sort'
  | 'focusPlot'
  | 'export'
  | 'cosmology'
  | 'session'
  | 'help'
  | 'escape';

export interface KeyBinding {
  action: ActionId;
  keys: readonly string[];
  /** What the help overlay says. */
  label: string;
}

export const KEY_MAP: readonly KeyBinding[] = [
  { action: 'next', keys: ['j', 'ArrowDown'], label: 'Next spectrum in the list' },
  { action: 'previous', keys: ['k', 'ArrowUp'], label: 'Previous spectrum in the list' },
  { action: 'nextUnreviewed', keys: ['n'], label: 'Next spectrum not yet reviewed' },
  { action: 'accept', keys: ['a', 'Enter'], label: 'Accept the solution shown (records a change when you picked another) and open the next unreviewed' },
  { action: 'reject', keys: ['x'], label: 'Reject as unusable and open the next unreviewed' },
  { action: 'reopen', keys: ['u'], label: 'Undo the decision on this spectrum (back to not reviewed)' },
  { action: 'candidate', keys: ['1', '2', '3', '4', '5', '6', '7', '8', '9'], label: 'Show candidate 1 to 9 (in the line list: choose that line)' },
  { action: 'bestOfClass', keys: ['Q', 'G', 'S'], label: 'Show the best quasar (Shift+Q), galaxy (Shift+G) or star (Shift+S) solution' },
  { action: 'refine', keys: ['r'], label: 'Refit near the redshift shown (after naming a line or typing a z); says how far it moved' },
  { action: 'compare', keys: ['o'], label: 'Compare with another candidate (its model dashed, its lines as ticks from the bottom); again for the next, then off' },
  { action: 'typeZ', keys: ['z'], label: 'Type a redshift' },
  { action: 'nameLine', keys: ['l'], label: 'Name a line: type its observed wavelength (or click a feature in the spectrum)' },
  { action: 'grade', keys: ['g'], label: 'Cycle your confidence grade: high, medium, low, none' },
  { action: 'note', keys: ['e'], label: 'Write a note' },
  { action: 'flag', keys: FLAGS.map((f) => f.key), label: `Toggle a review flag. ${FLAGS.map((f) => `${f.key}: ${f.label}`).join('; ')}` },
  { action: 'filter', keys: ['f'], label: 'Cycle the list filter' },
  { action: 'sort', keys: ['s'], label: 'Cycle the list order' },
  { action: 'jump', keys: ['/'], label: 'Jump to a spectrum by name (type part of its id or file name, Enter)' },
  { action: 'focusPlot', keys: ['v'], label: 'Put the keyboard on the spectrum plot (zoom and pan keys below)' },
  { action: 'export', keys: ['t'], label: 'Open the catalogue export' },
  { action: 'cosmology', keys: ['c'], label: 'Open the cosmology settings' },
  { action: 'session', keys: ['b'], label: 'Open the session panel (save, load, add files)' },
  { action: 'help', keys: ['?'], label: 'Show or hide this list of keys' },
  { action: 'escape', keys: ['Escape'], label: 'Close a panel, leave a text field or stop naming a line' },
];

const BY_KEY = new Map<string, ActionId>();
for (const b of KEY_MAP) for (const k of b.keys) BY_KEY.set(k, b.action);

/** The action bound to a key press, or null. Modifier chords (Ctrl, Alt, Meta) are left to the browser. */
export function actionForKey(e: { key: string; ctrlKey?: boolean; altKey?: boolean; metaKey?: boolean }): ActionId | null {
  if (e.ctrlKey || e.altKey || e.metaKey) return null;
  return BY_KEY.get(e.key) ?? null;
}

/** The first key bound to an action, for buttons' hints. */
export function keyFor(action: ActionId): string {
  return KEY_MAP.find((b) => b.action === action)!.keys[0];
}
