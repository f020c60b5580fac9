import { act, renderHook } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { setSession } from '../auth/session.js';
import { draftStorageKey, useDraft } from './useDraft.js';

describe('useDraft', () => {
  it('starts from the initial value and persists each change', () => {
    setSession({ accessToken: 't', user: { id: 7, email: 'r@example.com', name: 'R', role: 'researcher' } });
    const { result } = renderHook(() => useDraft('sweep-builder', { name: '' }));
    expect(result.current[0]).toEqual({ name: '' });
    expect(result.current[2].restored).toBe(false);
    act(() => result.current[1]({ name: 'Argon column' }));
    expect(result.current[0]).toEqual({ name: 'Argon column' });
    expect(JSON.parse(window.localStorage.getItem('driftgrid.draft.7.sweep-builder')!)).toEqual({
      name: 'Argon column',
    });
  });

  it('restores a stored draft after a remount (re-sign-in) and clears it on request', () => {
    setSession({ accessToken: 't', user: { id: 7, email: 'r@example.com', name: 'R', role: 'researcher' } });
    window.localStorage.setItem(draftStorageKey('sweep-builder'), JSON.stringify({ name: 'Edge scan' }));
    const { result } = renderHook(() => useDraft('sweep-builder', { name: '' }));
    expect(result.current[0]).toEqual({ name: 'Edge scan' });
    expect(result.current[2].restored).toBe(true);
    act(() => result.current[1]((prev) => ({ name: `${prev.name}, deuterium` })));
    expect(result.current[0]).toEqual({ name: 'Edge scan, deuterium' });
    act(() => result.current[2].clear());
    expect(result.current[0]).toEqual({ name: '' });
    expect(window.localStorage.getItem(draftStorageKey('sweep-builder'))).toBeNull();
  });

  it('keeps drafts of different users apart', () => {
    window.localStorage.setItem('driftgrid.draft.7.notes', JSON.stringify('mine'));
    setSession({ accessToken: 't', user: { id: 8, email: 'o@example.com', name: 'O', role: 'researcher' } });
    const { result } = renderHook(() => useDraft('notes', ''));
    expect(result.current[0]).toBe('');
  });

  it('falls back to the initial value when storage holds broken JSON', () => {
    window.localStorage.setItem(draftStorageKey('broken'), '{not json');
    const { result } = renderHook(() => useDraft('broken', 3));
    expect(result.current[0]).toBe(3);
  });
});
