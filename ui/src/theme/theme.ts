import { createTheme, type CSSVariablesResolver } from '@mantine/core';
import { ember, iris, moss, night, primaryShade, rust, slate, tide } from './palette.js';

const fontFamily = "'Fira Sans', system-ui, -apple-system, 'Segoe UI', Roboto, sans-serif";

export const theme = createTheme({
  primaryColor: 'tide',
  primaryShade,
  colors: { tide, ember, moss, rust, iris, slate, dark: night },
  white: '#ffffff',
  black: '#161b20',
  fontFamily,
  fontFamilyMonospace: "ui-monospace, 'SFMono-Regular', Menlo, Consolas, monospace",
  headings: { fontFamily, fontWeight: '500' },
  defaultRadius: 'sm',
  cursorType: 'pointer',
  // Compact by default: scientists at a desk want density, not air.
  components: {
    Table: { defaultProps: { verticalSpacing: 4, horizontalSpacing: 'sm', fz: 'sm' } },
    Button: { defaultProps: { size: 'sm' } },
    TextInput: { defaultProps: { size: 'sm' } },
    PasswordInput: { defaultProps: { size: 'sm' } },
  },
});

// Mantine's defaults for dimmed text, placeholders and errors fall below AA on white; ours pass.
export const cssVariablesResolver: CSSVariablesResolver = () => ({
  variables: {},
  light: {
    '--mantine-color-dimmed': slate[6],
    '--mantine-color-placeholder': slate[5],
    '--mantine-color-error': rust[7],
    '--mantine-color-default-border': slate[3],
  },
  dark: {
    '--mantine-color-dimmed': night[2],
    '--mantine-color-placeholder': night[3],
    '--mantine-color-error': rust[3],
  },
});

/** Colours the theme puts text on, for the contrast test. */
export const surfaces = { lightBody: '#ffffff', darkBody: night[7], darkText: night[0], lightText: '#161b20' } as const;
