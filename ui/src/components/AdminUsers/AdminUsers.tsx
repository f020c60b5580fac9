import { Alert, Badge, Button, Group, Pagination, Select, Switch, Table, Text, TextInput } from '@mantine/core';
import { useDebouncedValue } from '@mantine/hooks';
import { useState } from 'react';
import { ApiError } from '../../api/client.js';
import { useAdminUsers, usePatchUser, type AdminUser } from '../../api/admin.js';
import type { Role } from '../../auth/session.js';
import { ROLES } from '../AdminShared/labels.js';
import { formatDateTime } from '../../lib/formatDate.js';

const PAGE_SIZE = 25;

/** Users table: search, role filter, role change and deactivation (the last admin rule is the server's, shown here). */
export function AdminUsers() {
  const [search, setSearch] = useState('');
  const [q] = useDebouncedValue(search, 250);
  const [role, setRole] = useState<Role | ''>('');
  const [page, setPage] = useState(1);
  const [rowError, setRowError] = useState<{ id: number; message: string } | null>(null);
  const filters = { q, role, page };
  const list = useAdminUsers({ ...filters, pageSize: PAGE_SIZE });
  const patch = usePatchUser({
    onMutate: () => setRowError(null),
    onError: (err, v) =>
      setRowError({ id: v.id, message: err instanceof ApiError ? err.message : 'The change could not be saved' }),
  });

  const rows = (list.data?.items ?? []).map((u: AdminUser) => (
    <Table.Tr key={u.id} data-testid={`user-row-${u.id}`}>
      <Table.Td>
        <Text fz="sm" fw={500}>
          {u.name}
        </Text>
        <Text fz="xs" c="dimmed">
          {u.email}
        </Text>
        {rowError?.id === u.id ? (
          <Text fz="xs" c="red" role="alert">
            {rowError.message}
          </Text>
        ) : null}
      </Table.Td>
      <Table.Td>
        <Select
          aria-label={`Role of ${u.email}`}
          data={ROLES.map((r) => ({ value: r, label: r }))}
          value={u.role}
          allowDeselect={false}
          w={140}
          size="xs"
          onChange={(v) => v && v !== u.role && patch.mutate({ id: u.id, patch: { role: v as Role } })}
        />
      </Table.Td>
      <Table.Td>
        <Switch
          aria-label={`${u.email} active`}
          checked={u.active}
          label={u.active ? 'Active' : 'Deactivated'}
          onChange={(e) => patch.mutate({ id: u.id, patch: { active: e.currentTarget.checked } })}
        />
        {u.locked ? (
          <Badge color="yellow" variant="light" mt={4}>
            locked a few minutes
          </Badge>
        ) : null}
      </Table.Td>
      <Table.Td>
        <Text fz="xs">{formatDateTime(u.createdAt)}</Text>
      </Table.Td>
    </Table.Tr>
  ));

  return (
    <>
      <Group mb="sm" gap="sm" wrap="wrap">
        <TextInput
          placeholder="Search by e-mail or name"
          value={search}
          onChange={(e) => {
            setSearch(e.currentTarget.value);
            setPage(1);
          }}
          w={280}
          aria-label="Search users"
        />
        <Select
          placeholder="Any role"
          aria-label="Filter by role"
          data={ROLES.map((r) => ({ value: r, label: r }))}
          value={role || null}
          onChange={(v) => {
            setRole((v ?? '') as Role | '');
            setPage(1);
          }}
          clearable
          w={160}
        />
        {search || role ? (
          <Button
            variant="subtle"
            onClick={() => {
              setSearch('');
              setRole('');
            }}
          >
            Clear filters
          </Button>
        ) : null}
      </Group>
      <Text fz="xs" c="dimmed" mb="xs">
        The last active admin can be neither demoted nor deactivated: make someone else an admin first.
      </Text>
      {list.error ? <Alert color="red">{list.error.message}</Alert> : null}
      {list.data && list.data.items.length === 0 ? (
        <Text c="dimmed" fz="sm" py="lg" ta="center">
          No user matches these filters. Invite people from the Invitations tab.
        </Text>
      ) : (
        <Table.ScrollContainer minWidth={640}>
          <Table striped verticalSpacing="xs">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>User</Table.Th>
                <Table.Th>Role</Table.Th>
                <Table.Th>Status</Table.Th>
                <Table.Th>Created</Table.Th>
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>{rows}</Table.Tbody>
          </Table>
        </Table.ScrollContainer>
      )}
      {list.data && list.data.total > PAGE_SIZE ? (
        <Pagination mt="sm" total={Math.ceil(list.data.total / PAGE_SIZE)} value={page} onChange={setPage} />
      ) : null}
    </>
  );
}
