import { useCallback, useEffect, useRef, useState } from 'react';
import { getSession } from '../auth/session.js';

const PREFIX = 'driftgrid.draft';

/** Storage key for a draft, namespaced by user so a colleague signing in never sees it. */
export function draftStorageKey(
  key: string,
  userId: string | number | null | undefined = getSession()?.user.id,
): string {
  return `${PREFIX}.${userId ?? 'anonymous'}.${key}`;
}

function load<T>(storageKey: string, initial: T): T {
  try {
    const raw = window.localStorage.getItem(storageKey);
    return raw === null ? initial : (JSON.parse(raw) as T);
  } catch {
    return initial;
  }
}

export interface DraftControls {
  /** Forget the draft (after a successful submit) and go back to the initial value. */
  clear: () => void;
  /** True when the value came from storage rather than `initial`. */
  restored: boolean;
}

/**
 * `useState` that survives reloads and re-sign-in: every change is written to localStorage, so a
 * 401 in the middle of editing loses nothing. Values must be JSON-serialisable. Sign-out does not
 * clear drafts; `clear()` after submitting does.
 */
export function useDraft<T>(key: string, initial: T): [T, (next: T | ((prev: T) => T)) => void, DraftControls] {
  const storageKey = draftStorageKey(key);
  const initialRef = useRef(initial);
  const [state, setState] = useState<{ key: string; value: T; restored: boolean }>(() => {
    const value = load(storageKey, initial);
    return { key: storageKey, value, restored: value !== initial };
  });

  // A different key (another sweep, another user) starts from its own stored draft.
  let current = state;
  if (state.key !== storageKey) {
    const value = load(storageKey, initialRef.current);
    current = { key: storageKey, value, restored: value !== initialRef.current };
    setState(current);
  }

  const setValue = useCallback((next: T | ((prev: T) => T)) => {
    setState((prev) => {
      const value = typeof next === 'function' ? (next as (p: T) => T)(prev.value) : next;
      try {
        window.localStorage.setItem(prev.key, JSON.stringify(value));
      } catch {
        // Storage full or blocked: the draft still lives in memory for this visit.
      }
      return { ...prev, value };
    });
  }, []);

  const clear = useCallback(() => {
    window.localStorage.removeItem(storageKey);
    setState({ key: storageKey, value: initialRef.current, restored: false });
  }, [storageKey]);

  // Other tabs editing the same draft.
  useEffect(() => {
    const onStorage = (e: StorageEvent) => {
      if (e.key === storageKey)
        setState({ key: storageKey, value: load(storageKey, initialRef.current), restored: true });
    };
    window.addEventListener('storage', onStorage);
    return () => window.removeEventListener('storage', onStorage);
  }, [storageKey]);

  return [current.value, setValue, { clear, restored: current.restored }];
}

/** Remove every draft of one user (used by an explicit "discard all drafts" action if wanted). */
export function clearDrafts(userId: string | number): void {
  const prefix = `${PREFIX}.${userId}.`;
  for (let i = window.localStorage.length - 1; i >= 0; i--) {
    const k = window.localStorage.key(i);
    if (k?.startsWith(prefix)) window.localStorage.removeItem(k);
  }
}
