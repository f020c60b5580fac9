import { Alert, Code, Pagination, Table, Text } from '@mantine/core';
import { IconCode } from '@tabler/icons-react';
import { useState } from 'react';
import { useAuditLog } from '../../api/admin.js';
import { formatDateTime } from '../../lib/formatDate.js';

/**
 * Who did what, when: every admin action, newest first, as a sentence saying what changed; the
 * recorded JSON sits behind a disclosure. Test hooks: `audit-row-<id>`, `audit-summary`, `audit-json`.
 */
export function AdminAudit() {
  const [page, setPage] = useState(1);
  const log = useAuditLog(page);
  if (log.error) return <Alert color="red">{log.error.message}</Alert>;
  if (!log.data)
    return (
      <Text c="dimmed" fz="sm">
        Loading the audit log…
      </Text>
    );
  if (log.data.items.length === 0)
    return (
      <Text c="dimmed" fz="sm" ta="center" py="lg">
        No admin actions yet. Role changes, invitations and quota changes are recorded here.
      </Text>
    );
  return (
    <>
      <Table.ScrollContainer minWidth={640}>
        <Table striped verticalSpacing="xs">
          <Table.Thead>
            <Table.Tr>
              <Table.Th>When</Table.Th>
              <Table.Th>Who</Table.Th>
              <Table.Th>What changed</Table.Th>
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {log.data.items.map((e) => (
              <Table.Tr key={e.id} data-testid={`audit-row-${e.id}`}>
                <Table.Td>
                  <Text fz="xs">{formatDateTime(e.createdAt)}</Text>
                </Table.Td>
                <Table.Td>
                  <Text fz="sm">{e.actor?.name ?? 'system'}</Text>
                  {e.actor ? (
                    <Text fz="xs" c="dimmed">
                      {e.actor.email}
                    </Text>
                  ) : null}
                </Table.Td>
                <Table.Td>
                  <Text fz="sm" data-testid="audit-summary">
                    {e.summary}
                  </Text>
                  {e.details ? (
                    <details data-testid="audit-json">
                      <summary style={{ cursor: 'pointer' }}>
                        <Text span fz="xs" c="dimmed">
                          <IconCode size={12} style={{ verticalAlign: -1 }} aria-hidden /> Recorded details (JSON)
                        </Text>
                      </summary>
                      <Code block fz="xs" mt={4}>
                        {JSON.stringify({ action: e.action, target: e.target, ...e.details }, null, 2)}
                      </Code>
                    </details>
                  ) : null}
                </Table.Td>
              </Table.Tr>
            ))}
          </Table.Tbody>
        </Table>
      </Table.ScrollContainer>
      {log.data.total > log.data.pageSize ? (
        <Pagination mt="sm" total={Math.ceil(log.data.total / log.data.pageSize)} value={page} onChange={setPage} />
      ) : null}
    </>
  );
}
