import { Alert, Code, Pagination, Table, Text } from '@mantine/core';
import { useState } from 'react';
import { useAuditLog } from '../../api/admin.js';
import { formatWhen } from '../AdminShared/labels.js';

/** Who did what, when: every admin action, newest first. */
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
      <Table.ScrollContainer minWidth={720}>
        <Table striped verticalSpacing="xs">
          <Table.Thead>
            <Table.Tr>
              <Table.Th>When</Table.Th>
              <Table.Th>Who</Table.Th>
              <Table.Th>What</Table.Th>
              <Table.Th>Target</Table.Th>
              <Table.Th>Details</Table.Th>
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {log.data.items.map((e) => (
              <Table.Tr key={e.id}>
                <Table.Td>
                  <Text fz="xs">{formatWhen(e.createdAt)}</Text>
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
                  <Code>{e.action}</Code>
                </Table.Td>
                <Table.Td>
                  <Text fz="xs">{e.target ?? '—'}</Text>
                </Table.Td>
                <Table.Td>
                  <Text fz="xs" c="dimmed" lineClamp={2} title={e.details ? JSON.stringify(e.details) : undefined}>
                    {e.details ? JSON.stringify(e.details) : '—'}
                  </Text>
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
