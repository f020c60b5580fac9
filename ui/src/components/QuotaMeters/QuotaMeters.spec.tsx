import { MantineProvider } from '@mantine/core';
import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { QuotaMeters } from './QuotaMeters.js';

const quota = {
  maxPointsPerSweep: 2_000_000,
  maxRunningSweeps: 3,
  maxPointsPer30Days: 20_000_000,
  maxStoredPoints: 50_000_000,
};

describe('QuotaMeters', () => {
  it('shows usage against each limit in words', () => {
    render(
      <MantineProvider>
        <QuotaMeters quota={quota} usage={{ runningSweeps: 1, pointsLast30Days: 1_500_000, storedPoints: 0 }} />
      </MantineProvider>,
    );
    expect(screen.getByTestId('quota-maxRunningSweeps').textContent).toContain('1 used of 3 sweeps');
    expect(screen.getByTestId('quota-maxPointsPer30Days').textContent).toContain(
      'Points per rolling 30 days1.50 million used of 20 million points',
    );
    expect(screen.getByTestId('quota-maxPointsPerSweep').textContent).toBe('Points per sweep: at most 2 million.');
  });

  it('says what is used and what the sweep being built would add, with exact counts below a million', () => {
    render(
      <MantineProvider>
        <QuotaMeters
          quota={quota}
          usage={{ runningSweeps: 0, pointsLast30Days: 1_200, storedPoints: 0 }}
          requested={13_950}
        />
      </MantineProvider>,
    );
    expect(screen.getByTestId('quota-maxPointsPer30Days').textContent).toContain(
      '1,200 used + 13,950 this sweep of 20 million points',
    );
    expect(screen.getByTestId('quota-maxPointsPerSweep').textContent).toBe(
      'Points per sweep: at most 2 million; this sweep has 13,950.',
    );
  });

  it('warns when the sweep being built would go over a limit', () => {
    render(
      <MantineProvider>
        <QuotaMeters quota={{ ...quota, maxRunningSweeps: 1 }} usage={{ runningSweeps: 1 }} requested={10} />
      </MantineProvider>,
    );
    expect(screen.getByTestId('quota-maxRunningSweeps').textContent).toMatch(/go over your limit/);
  });
});
