import { Group, Text, Title } from '@mantine/core';
import type { ReactNode } from 'react';

/** Page title row shared by every page: heading, one line of purpose, actions on the right. */
export function PageHeader({
  title,
  description,
  actions,
}: {
  title: string;
  description?: ReactNode;
  actions?: ReactNode;
}) {
  return (
    <Group justify="space-between" align="flex-start" mb="md" wrap="wrap" gap="sm">
      <div>
        <Title order={1} fz="h2">
          {title}
        </Title>
        {description ? (
          <Text c="dimmed" fz="sm" mt={4}>
            {description}
          </Text>
        ) : null}
      </div>
      {actions ? <Group gap="xs">{actions}</Group> : null}
    </Group>
  );
}
