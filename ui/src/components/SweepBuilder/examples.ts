/**
 * The definitions in the repository's examples/ folder, bundled at build time (Vite glob import),
 * for the builder's "Load example" menu. The same files seed the demo catalogue.
 */
const files = import.meta.glob('../../../../examples/*.json', { eager: true, import: 'default' }) as Record<
  string,
  unknown
>;

export interface ExampleDefinition {
  file: string;
  name: string;
  model: string;
  definition: unknown;
}

export const exampleDefinitions: ExampleDefinition[] = Object.entries(files)
  .map(([path, definition]) => {
    const d = definition as { name?: unknown; model?: unknown };
    return {
      file: path.split('/').pop()!,
      name: typeof d.name === 'string' ? d.name : path,
      model: typeof d.model === 'string' ? d.model : '',
      definition,
    };
  })
  .sort((a, b) => a.file.localeCompare(b.file));
