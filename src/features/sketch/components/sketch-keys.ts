import { useEffect, useRef } from 'react';
import type { Direction } from '@shared/model/spool';

/** Keyboard map of the sketcher (shown in the help popover). */
export const DIRECTION_KEYS: readonly { key: string; label: string; direction: Direction }[] = [
  { key: 'ArrowUp', label: '↑', direction: 'north' },
  { key: 'ArrowDown', label: '↓', direction: 'south' },
  { key: 'ArrowRight', label: '→', direction: 'east' },
  { key: 'ArrowLeft', label: '←', direction: 'west' },
  { key: 'PageUp', label: 'PgUp', direction: 'up' },
  { key: 'PageDown', label: 'PgDn', direction: 'down' },
];

export const KEY_HELP: readonly { keys: string; what: string }[] = [
  { keys: '↑ ↓ → ←', what: 'draw a leg north / south / east / west at the run’s end' },
  { keys: 'PgUp  PgDn', what: 'draw a leg up / down' },
  { keys: 'Shift + any of those', what: 'insert the leg after the selected element' },
  { keys: 'Ctrl + Z', what: 'undo' },
  { keys: 'Ctrl + Shift + Z  or  Ctrl + Y', what: 'redo' },
  { keys: 'Delete', what: 'delete the selected element' },
  { keys: 'Esc', what: 'clear the selection' },
  { keys: 'F', what: 'fit the spool in view' },
  { keys: 'Shift + F', what: 'focus on the selected element (zoom to it)' },
  { keys: 'Ctrl + S', what: 'save' },
  { keys: '?', what: 'show or hide this list' },
];

export interface SketchKeyHandlers {
  readonly onDirection?: (direction: Direction, insertAfterSelected: boolean) => void;
  readonly onUndo?: () => void;
  readonly onRedo?: () => void;
  readonly onDelete?: () => void;
  readonly onEscape?: () => void;
  readonly onFit?: () => void;
  readonly onFocusSelected?: () => void;
  readonly onSave?: () => void;
  readonly onHelp?: () => void;
}

const isTyping = (target: EventTarget | null) => {
  const el = target as HTMLElement | null;
  if (!el || typeof el.tagName !== 'string') return false;
  if (el.tagName === 'INPUT') {
    // A focused checkbox or button-like input takes no typing; radios use the arrow keys.
    const type = (el as HTMLInputElement).type;
    return !['checkbox', 'button', 'submit', 'reset', 'file', 'color'].includes(type);
  }
  return el.isContentEditable || ['SELECT', 'TEXTAREA'].includes(el.tagName);
};

/** Listen for the sketcher's keys on the window; ignored while the user types in a field. */
export function useSketchKeys(handlers: SketchKeyHandlers, enabled = true): void {
  const ref = useRef(handlers);
  useEffect(() => {
    ref.current = handlers;
  });
  useEffect(() => {
    if (!enabled) return;
    const onKey = (e: KeyboardEvent) => {
      const h = ref.current;
      const mod = e.ctrlKey || e.metaKey;
      if (mod && e.key.toLowerCase() === 's') {
        if (h.onSave) {
          e.preventDefault();
          h.onSave();
        }
        return;
      }
      if (isTyping(e.target)) return;
      if (mod && e.key.toLowerCase() === 'z') {
        e.preventDefault();
        if (e.shiftKey) h.onRedo?.();
        else h.onUndo?.();
        return;
      }
      if (mod && e.key.toLowerCase() === 'y') {
        e.preventDefault();
        h.onRedo?.();
        return;
      }
      if (mod || e.altKey) return;
      const dir = DIRECTION_KEYS.find((d) => d.key === e.key);
      if (dir && h.onDirection) {
        e.preventDefault();
        h.onDirection(dir.direction, e.shiftKey);
        return;
      }
      if (e.key === 'Delete' || e.key === 'Backspace') {
        if (h.onDelete) {
          e.preventDefault();
          h.onDelete();
        }
        return;
      }
      if (e.key === 'Escape') h.onEscape?.();
      else if ((e.key === 'f' || e.key === 'F') && e.shiftKey) h.onFocusSelected?.();
      else if (e.key === 'f' || e.key === 'F') h.onFit?.();
      else if (e.key === '?') h.onHelp?.();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [enabled]);
}
