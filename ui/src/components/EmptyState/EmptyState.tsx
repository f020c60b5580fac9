import { Stack, Text, ThemeIcon, Title } from '@mantine/core';
import type { Icon } from '@tabler/icons-react';
import type { ReactNode } from 'react';

export interface EmptyStateProps {
  icon: Icon;
  title: string;
  /** What this place is for / what will appear here. */
  children: ReactNode;
  /** What to do now: buttons or links. */
  actions?: ReactNode;
}

/** The empty state every page shows before it has content: what this is, and what to do next. */
export function EmptyState({ icon: Glyph, title, children, actions }: EmptyStateProps) {
  return (
    <Stack align="center" gap="sm" py={48} px="md" maw={620} mx="auto" ta="center" data-testid="empty-state">
      <ThemeIcon size={52} radius="xl" variant="light" color="tide" aria-hidden>
        <Glyph size={28} stroke={1.6} />
      </ThemeIcon>
      <Title order={2} fz="h3">
        {title}
      </Title>
      <Text c="dimmed" component="div" fz="sm" style={{ lineHeight: 1.55 }}>
        {children}
      </Text>
      {actions ? (
        <div style={{ marginTop: 8, display: 'flex', gap: 8, flexWrap: 'wrap', justifyContent: 'center' }}>
          {actions}
        </div>
      ) : null}
    </Stack>
  );
}
