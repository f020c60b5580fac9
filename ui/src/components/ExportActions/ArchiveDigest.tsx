import { ActionIcon, Code, CopyButton, Group, Text, Tooltip } from '@mantine/core';
import { IconCheck, IconCopy } from '@tabler/icons-react';
import { formatBytes } from '../../lib/format.js';

/** The SHA-256 of a frozen export in a copyable monospace field, with its size. */
export function ArchiveDigest({
  sha256,
  bytes,
  testId = 'archive-sha256',
}: {
  sha256: string;
  bytes?: number | null;
  testId?: string;
}) {
  return (
    <Group gap="xs" wrap="nowrap" align="center">
      <Text size="sm" c="dimmed" style={{ whiteSpace: 'nowrap' }}>
        SHA-256
      </Text>
      <Code
        data-testid={testId}
        style={{ fontFamily: 'var(--mantine-font-family-monospace)', wordBreak: 'break-all', userSelect: 'all' }}
      >
        {sha256}
      </Code>
      <CopyButton value={sha256} timeout={1500}>
        {({ copied, copy }) => (
          <Tooltip label={copied ? 'Copied' : 'Copy SHA-256'} withArrow>
            <ActionIcon variant="subtle" onClick={copy} aria-label="Copy SHA-256">
              {copied ? <IconCheck size={16} /> : <IconCopy size={16} />}
            </ActionIcon>
          </Tooltip>
        )}
      </CopyButton>
      {bytes ? (
        <Text size="sm" c="dimmed" style={{ whiteSpace: 'nowrap' }}>
          {formatBytes(bytes)}
        </Text>
      ) : null}
    </Group>
  );
}
