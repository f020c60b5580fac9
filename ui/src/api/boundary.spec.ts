import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

// All data access lives under ui/src/api/ (hooks + query keys); components and pages import hooks.
// happy-dom gives import.meta.url an http scheme, so resolve from the repository root vitest runs in.
const src = join(process.cwd(), 'ui', 'src');

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return files(path);
    return /\.(ts|tsx)$/.test(name) && !/\.spec\.tsx?$/.test(name) ? [path] : [];
  });
}

/** What only ui/src/api/ may do: run queries, touch the cache, call the server. */
const DATA_ACCESS: [string, RegExp][] = [
  ['a React Query hook', /\buse(Query|Queries|Mutation|InfiniteQuery|QueryClient|SuspenseQuery)\s*\(/],
  ['the api client', /\b(api\.(get|post|put|patch|delete)|apiRequest|apiDownload)\s*[<(]/],
  ['fetch', /\bfetch\s*\(/],
  ['the query keys', /from '[./]*\/?api\/queryKeys\.js'/],
];

describe('ui data access boundary', () => {
  const outside = ['components', 'pages', 'hooks', 'lib', 'auth'].flatMap((d) => {
    try {
      return files(join(src, d));
    } catch {
      return [];
    }
  });

  it('finds the component and page sources it checks', () => {
    expect(outside.some((f) => f.includes('/components/'))).toBe(true);
    expect(outside.some((f) => f.includes('/pages/'))).toBe(true);
  });

  it('no component, page or helper outside ui/src/api/ queries, caches or fetches', () => {
    const found: string[] = [];
    for (const file of outside) {
      const text = readFileSync(file, 'utf8');
      for (const [what, re] of DATA_ACCESS) if (re.test(text)) found.push(`${relative(src, file)} uses ${what}`);
    }
    expect(found).toEqual([]);
  });

  it('the check catches a component that fetches (the rule is not vacuous)', () => {
    const sample = "const q = useQuery({ queryKey: ['x'], queryFn: () => api.get<X>('/x') });";
    expect(DATA_ACCESS.filter(([, re]) => re.test(sample)).map(([w]) => w)).toEqual([
      'a React Query hook',
      'the api client',
    ]);
  });
});
