import { Group, Text } from '@mantine/core';
import { useId } from 'react';

export interface NameMarkProps {
  /** Glyph height in px; the word scales with it. */
  size?: number;
  /** Show only the glyph (favicon-like uses, narrow rails). */
  glyphOnly?: boolean;
}

/**
 * Driftgrid's glyph: two field lines drifting across a square grid, with a copper guiding-centre
 * marker riding the upper line. Drawn inline so no request leaves the machine.
 */
export function DriftGlyph({ size = 28, title }: { size?: number; title?: string }) {
  const id = useId();
  return (
    <svg
      width={size}
      height={size}
      viewBox="0 0 32 32"
      role={title ? 'img' : undefined}
      aria-hidden={title ? undefined : true}
      aria-labelledby={title ? `${id}-t` : undefined}
      focusable="false"
    >
      {title ? <title id={`${id}-t`}>{title}</title> : null}
      <rect width="32" height="32" rx="7" fill="var(--mantine-color-tide-7)" />
      <g stroke="var(--mantine-color-tide-2)" strokeWidth="1" opacity="0.55">
        <path d="M8 5v22M16 5v22M24 5v22M5 8h22M5 16h22M5 24h22" />
      </g>
      <g fill="none" stroke="#ffffff" strokeWidth="2.2" strokeLinecap="round">
        <path d="M4 12c5-4 9 4 14 0s8-3 10-1" />
        <path d="M4 20c5-4 9 4 14 0s8-3 10-1" />
      </g>
      <circle cx="18" cy="12" r="2.3" fill="var(--mantine-color-ember-3)" />
    </svg>
  );
}

/** The name mark: glyph plus the word "Driftgrid" ("grid" in the primary colour). */
export function NameMark({ size = 28, glyphOnly = false }: NameMarkProps) {
  if (glyphOnly) return <DriftGlyph size={size} title="Driftgrid" />;
  return (
    <Group gap={8} wrap="nowrap" aria-label="Driftgrid" role="img">
      <DriftGlyph size={size} />
      <Text
        component="span"
        fw={700}
        fz={Math.round(size * 0.72)}
        lh={1}
        style={{ letterSpacing: '-0.01em' }}
        aria-hidden
      >
        Drift
        <Text component="span" inherit c="var(--mantine-color-anchor)">
          grid
        </Text>
      </Text>
    </Group>
  );
}
