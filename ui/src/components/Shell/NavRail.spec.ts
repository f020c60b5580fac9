import { describe, expect, it } from 'vitest';
import { navRoutes } from '../../routes.js';
import { isActive } from './NavRail.js';

const byLabel = (label: string) => navRoutes.find((r) => r.nav?.label === label)!;

describe('isActive', () => {
  it('highlights exactly one rail item per page', () => {
    const cases: [string, string][] = [
      ['/', 'Dashboard'],
      ['/sweeps/new', 'New sweep'],
      ['/sweeps/42', 'Catalogue'],
      ['/catalogue', 'Catalogue'],
      ['/fits', 'Fits'],
    ];
    for (const [path, label] of cases) {
      const active = navRoutes.filter((r) => isActive(r, path)).map((r) => r.nav!.label);
      expect(active, path).toEqual([label]);
    }
    expect(isActive(byLabel('Dashboard'), '/catalogue')).toBe(false);
  });
});
