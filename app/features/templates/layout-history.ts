// Undo and redo for the layout editor: a reducer over past, present and future snapshots (the
// "history" pattern of the Redux documentation, "Implementing Undo History"). Pure, so it is
// tested without React.

export interface History<T> {
  past: T[];
  present: T;
  future: T[];
  /** The coalescing tag of the last edit: a run of edits with the same tag is one undo step. */
  lastTag: string | null;
}

export type HistoryAction<T> =
  | { type: 'edit'; next: (present: T) => T; tag?: string }
  | { type: 'undo' }
  | { type: 'redo' };

/** Older steps than this are dropped: a long session must not hold every keystroke forever. */
export const HISTORY_LIMIT = 200;

export const startHistory = <T>(present: T): History<T> => ({ past: [], present, future: [], lastTag: null });

export function historyReducer<T>(h: History<T>, action: HistoryAction<T>): History<T> {
  switch (action.type) {
    case 'edit': {
      const next = action.next(h.present);
      if (next === h.present) return h;
      // Typing in one field is one step: the run replaces the present without adding to the past.
      if (action.tag !== undefined && action.tag === h.lastTag) return { ...h, present: next, future: [] };
      const past = h.past.length >= HISTORY_LIMIT ? [...h.past.slice(h.past.length - HISTORY_LIMIT + 1), h.present] : [...h.past, h.present];
      return { past, present: next, future: [], lastTag: action.tag ?? null };
    }
    case 'undo': {
      const previous = h.past.at(-1);
      if (previous === undefined) return h;
      return { past: h.past.slice(0, -1), present: previous, future: [h.present, ...h.future], lastTag: null };
    }
    case 'redo': {
      const [next, ...rest] = h.future;
      if (next === undefined) return h;
      return { past: [...h.past, h.present], present: next, future: rest, lastTag: null };
    }
  }
}
