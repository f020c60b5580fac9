import { MantineProvider } from '@mantine/core';
import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { theme } from '../../theme/theme.js';
import { STATUS_LOOK, StatusBadge, SWEEP_STATUSES } from './StatusBadge.js';

describe('StatusBadge', () => {
  it('names every sweep state in words with its own icon (never colour alone)', () => {
    render(
      <MantineProvider theme={theme}>
        {SWEEP_STATUSES.map((s) => (
          <StatusBadge key={s} status={s} />
        ))}
      </MantineProvider>,
    );
    for (const s of SWEEP_STATUSES) {
      const badge = screen.getByText(STATUS_LOOK[s].label).closest('[data-status]')!;
      expect(badge.getAttribute('data-status')).toBe(s);
      expect(badge.querySelector('svg')).not.toBeNull();
    }
    const icons = new Set(SWEEP_STATUSES.map((s) => STATUS_LOOK[s].icon));
    expect(icons.size).toBe(SWEEP_STATUSES.length);
  });

  it('shows progress beside the word and survives an unknown state', () => {
    render(
      <MantineProvider theme={theme}>
        <StatusBadge status="running" suffix="42 %" />
        <StatusBadge status="paused" />
      </MantineProvider>,
    );
    expect(screen.getByText('Running · 42 %')).toBeTruthy();
    expect(screen.getByText('paused')).toBeTruthy();
  });
});
