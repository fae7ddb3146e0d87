/** Keyboard shortcuts of the editor: one table drives both the key handler and the help overlay. */

export type EditorAction =
  | 'tool.select'
  | 'tool.rect'
  | 'tool.circle'
  | 'tool.ring'
  | 'tool.polygon'
  | 'tool.strip'
  | 'tool.pan'
  | 'undo'
  | 'redo'
  | 'delete'
  | 'duplicate'
  | 'selectAll'
  | 'deselect'
  | 'fit'
  | 'zoomIn'
  | 'zoomOut'
  | 'forward'
  | 'backward'
  | 'front'
  | 'back'
  | 'nudgeLeft'
  | 'nudgeRight'
  | 'nudgeUp'
  | 'nudgeDown'
  | 'bigNudgeLeft'
  | 'bigNudgeRight'
  | 'bigNudgeUp'
  | 'bigNudgeDown'
  | 'toggleSnap'
  | 'toggleGrid'
  | 'save'
  | 'help';

export interface Shortcut {
  action: EditorAction;
  /** Key combos, written as "Mod+Z" (Mod = Ctrl, or ⌘ on a Mac), "Shift+ArrowLeft", "R". */
  keys: string[];
  description: string;
  group: 'Tools' | 'Edit' | 'Arrange' | 'View' | 'File';
}

export const SHORTCUTS: readonly Shortcut[] = [
  { action: 'tool.select', keys: ['V', 'Escape'], description: 'Select and move', group: 'Tools' },
  { action: 'tool.rect', keys: ['R'], description: 'Draw a rectangle', group: 'Tools' },
  { action: 'tool.circle', keys: ['C'], description: 'Draw a circle', group: 'Tools' },
  { action: 'tool.ring', keys: ['O'], description: 'Draw a ring', group: 'Tools' },
  { action: 'tool.polygon', keys: ['P'], description: 'Draw a polygon (double-click or Enter to finish)', group: 'Tools' },
  { action: 'tool.strip', keys: ['S'], description: 'Draw a zero-thickness strip', group: 'Tools' },
  { action: 'tool.pan', keys: ['H'], description: 'Pan (or hold Space, or drag with the middle button)', group: 'Tools' },
  { action: 'undo', keys: ['Mod+Z'], description: 'Undo', group: 'Edit' },
  { action: 'redo', keys: ['Mod+Shift+Z', 'Mod+Y'], description: 'Redo', group: 'Edit' },
  { action: 'delete', keys: ['Delete', 'Backspace'], description: 'Delete the selection', group: 'Edit' },
  { action: 'duplicate', keys: ['Mod+D'], description: 'Duplicate the selection', group: 'Edit' },
  { action: 'selectAll', keys: ['Mod+A'], description: 'Select every shape', group: 'Edit' },
  { action: 'deselect', keys: ['Shift+Escape'], description: 'Clear the selection', group: 'Edit' },
  { action: 'nudgeLeft', keys: ['ArrowLeft'], description: 'Move left by one grid step', group: 'Arrange' },
  { action: 'nudgeRight', keys: ['ArrowRight'], description: 'Move right by one grid step', group: 'Arrange' },
  { action: 'nudgeUp', keys: ['ArrowUp'], description: 'Move up by one grid step', group: 'Arrange' },
  { action: 'nudgeDown', keys: ['ArrowDown'], description: 'Move down by one grid step', group: 'Arrange' },
  { action: 'bigNudgeLeft', keys: ['Shift+ArrowLeft'], description: 'Move left by ten grid steps', group: 'Arrange' },
  { action: 'bigNudgeRight', keys: ['Shift+ArrowRight'], description: 'Move right by ten grid steps', group: 'Arrange' },
  { action: 'bigNudgeUp', keys: ['Shift+ArrowUp'], description: 'Move up by ten grid steps', group: 'Arrange' },
  { action: 'bigNudgeDown', keys: ['Shift+ArrowDown'], description: 'Move down by ten grid steps', group: 'Arrange' },
  { action: 'forward', keys: [']'], description: 'Bring forward', group: 'Arrange' },
  { action: 'backward', keys: ['['], description: 'Send backward', group: 'Arrange' },
  { action: 'front', keys: ['}'], description: 'Bring to front', group: 'Arrange' },
  { action: 'back', keys: ['{'], description: 'Send to back', group: 'Arrange' },
  { action: 'fit', keys: ['F'], description: 'Fit the section in view', group: 'View' },
  { action: 'zoomIn', keys: ['+', '='], description: 'Zoom in', group: 'View' },
  { action: 'zoomOut', keys: ['-', '_'], description: 'Zoom out', group: 'View' },
  { action: 'toggleSnap', keys: ['N'], description: 'Snapping on or off (hold Alt while dragging to skip it once)', group: 'View' },
  { action: 'toggleGrid', keys: ['G'], description: 'Grid on or off', group: 'View' },
  { action: 'save', keys: ['Mod+S'], description: 'Save a new revision', group: 'File' },
  { action: 'help', keys: ['?'], description: 'Show this list', group: 'View' },
];

export interface KeyLike {
  key: string;
  ctrlKey: boolean;
  metaKey: boolean;
  shiftKey: boolean;
  altKey: boolean;
}

function comboOf(e: KeyLike): string {
  const parts: string[] = [];
  if (e.ctrlKey || e.metaKey) parts.push('Mod');
  let key = e.key.length === 1 ? e.key.toUpperCase() : e.key;
  // Keys that are themselves shifted characters are matched without "Shift+".
  const shifted = e.key.length === 1 && !/[A-Za-z]/.test(e.key);
  if (e.shiftKey && !shifted) parts.push('Shift');
  if (key === ' ') key = 'Space';
  parts.push(key);
  return parts.join('+');
}

/** The action for a key event, or undefined. */
export function actionForKey(e: KeyLike): EditorAction | undefined {
  const combo = comboOf(e);
  for (const s of SHORTCUTS) if (s.keys.includes(combo)) return s.action;
  return undefined;
}

export function displayKey(combo: string, mac = false): string {
  return combo
    .replace('Mod', mac ? '⌘' : 'Ctrl')
    .replace('ArrowLeft', '←')
    .replace('ArrowRight', '→')
    .replace('ArrowUp', '↑')
    .replace('ArrowDown', '↓');
}
