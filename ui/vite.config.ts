import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import { fileURLToPath } from 'node:url';

// `@driftgrid/domain` resolves through the workspace package (domain/dist); only vitest aliases
// it to source. Chart and table libraries are reached only from lazy routes, so they land in
// their own chunks and the first load (sign-in) carries React, the router and Mantine core only.
export default defineConfig({
  root: fileURLToPath(new URL('.', import.meta.url)),
  plugins: [react()],
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: { '/api': { target: 'http://127.0.0.1:3000' } },
  },
  preview: {
    host: '127.0.0.1',
    port: 4173,
    proxy: { '/api': { target: 'http://127.0.0.1:3000' } },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    target: 'es2022',
    // Two chunks pass the default 500 kB: the chart library and the domain bundle (mathjs units and
    // the models). Both are reached only from lazy routes, never on the first load (sign-in), so the
    // warning would be noise. A chunk past 1 MB still warns.
    chunkSizeWarningLimit: 1024,
    rolldownOptions: {
      output: {
        codeSplitting: {
          groups: [
            // Stable vendor chunks cache well across releases; lazy-only libraries stay lazy.
            // A group also takes in the dependencies of its modules unless a group of higher priority
            // claims them first: the shared vendors (React, Mantine, tslib) therefore rank above the
            // lazy-only libraries, or the table chunk would carry React and import all of echarts.
            { name: 'tslib', test: /node_modules[\\/]tslib[\\/]/, priority: 60 },
            { name: 'icons', test: /node_modules[\\/]@tabler[\\/]icons-react[\\/]/, priority: 55 },
            { name: 'charts', test: /node_modules[\\/](echarts|zrender)[\\/]/, priority: 30 },
            {
              name: 'tables',
              test: /node_modules[\\/](mantine-react-table|@tanstack[\\/](react-table|table-core|react-virtual|virtual-core|match-sorter-utils))[\\/]/,
              priority: 30,
            },
            { name: 'dates', test: /node_modules[\\/](@mantine[\\/]dates|dayjs)[\\/]/, priority: 30 },
            {
              name: 'dropzone',
              test: /node_modules[\\/](@mantine[\\/]dropzone|react-dropzone|attr-accept|file-selector)[\\/]/,
              priority: 30,
            },
            {
              name: 'react',
              test: /node_modules[\\/](react|react-dom|scheduler|react-router|react-router-dom|cookie|set-cookie-parser)[\\/]/,
              priority: 50,
            },
            {
              name: 'mantine',
              test: /node_modules[\\/](@mantine[\\/](core|hooks|notifications|store)|@floating-ui|react-remove-scroll|react-remove-scroll-bar|react-style-singleton|use-callback-ref|use-sidecar|react-number-format|react-textarea-autosize|clsx|tslib|get-nonce|detect-node-es)[\\/]/,
              priority: 45,
            },
          ],
        },
      },
    },
  },
});
