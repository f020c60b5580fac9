import type { KeyboardEvent } from 'react';

/** Ctrl+Enter (⌘+Enter on a Mac) submits the form from any field. */
export function ctrlEnter(submit: () => void) {
  return (e: KeyboardEvent) => {
    if (e.key === 'Enter' && (e.ctrlKey || e.metaKey)) {
      e.preventDefault();
      submit();
    }
  };
}
