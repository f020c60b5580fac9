import { Alert, Button, Group, Pagination, Paper, Select, Table, Text, TextInput } from '@mantine/core';
import { useState, type FormEvent } from 'react';
import { invitationRequestSchema } from '@driftgrid/domain';
import { ApiError } from '../../api/client.js';
import { useInvitations, useInvite, useRevokeInvitation } from '../../api/admin.js';
import type { Role } from '../../auth/session.js';
import { ROLES } from '../AdminShared/labels.js';
import { formatDateTime } from '../../lib/formatDate.js';
import { ctrlEnter } from '../AdminShared/ctrlEnter.js';
import { StateBadge } from '../StatusBadge/StateBadge.js';

/** Invite by e-mail with a role (the link is valid 7 days, once), and the list of invitations. */
export function AdminInvitations() {
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('researcher');
  const [errors, setErrors] = useState<{ email?: string; role?: string; form?: string }>({});
  const [sent, setSent] = useState<string | null>(null);
  const [page, setPage] = useState(1);
  const list = useInvitations(page);
  const invite = useInvite({
    onSuccess: (inv) => {
      setSent(
        inv.mailed === false
          ? `Invitation for ${inv.email} saved, but the mail could not be sent; check the mail settings.`
          : `Invitation sent to ${inv.email}.`,
      );
      setEmail('');
    },
    onError: (err) => {
      if (err instanceof ApiError)
        setErrors({
          email: err.detailFor('email'),
          role: err.detailFor('role'),
          form: err.detailFor('email') ? undefined : err.message,
        });
      else setErrors({ form: 'The invitation could not be sent' });
    },
  });
  const revoke = useRevokeInvitation();

  const submit = () => {
    setSent(null);
    const parsed = invitationRequestSchema.safeParse({ email, role });
    if (!parsed.success) {
      const e: typeof errors = {};
      for (const i of parsed.error.issues) e[String(i.path[0]) as 'email' | 'role'] = i.message;
      setErrors(e);
      return;
    }
    setErrors({});
    invite.mutate(parsed.data);
  };
  const onSubmit = (e: FormEvent) => {
    e.preventDefault();
    submit();
  };

  return (
    <>
      <Paper
        withBorder
        p="md"
        mb="md"
        component="form"
        onSubmit={onSubmit}
        onKeyDown={ctrlEnter(submit)}
        noValidate
        aria-label="Invite someone"
      >
        <Group align="flex-start" gap="sm" wrap="wrap">
          <TextInput
            label="E-mail address"
            placeholder="colleague@university.example"
            value={email}
            onChange={(e) => setEmail(e.currentTarget.value)}
            error={errors.email}
            w={300}
            required
          />
          <Select
            label="Role"
            data={ROLES.map((r) => ({ value: r, label: r }))}
            value={role}
            onChange={(v) => v && setRole(v as Role)}
            allowDeselect={false}
            error={errors.role}
            w={160}
          />
          <Button type="submit" mt={25} loading={invite.isPending}>
            Send invitation
          </Button>
        </Group>
        <Text fz="xs" c="dimmed" mt="xs">
          The invitee gets a link valid for 7 days that works once; they choose their name and password. Ctrl+Enter
          sends.
        </Text>
        {errors.form ? (
          <Alert color="red" mt="sm">
            {errors.form}
          </Alert>
        ) : null}
        {sent ? (
          <Alert color="green" mt="sm">
            {sent}
          </Alert>
        ) : null}
      </Paper>
      {list.data && list.data.items.length === 0 ? (
        <Text c="dimmed" fz="sm" ta="center" py="lg">
          No invitations yet. Invite a colleague with the form above.
        </Text>
      ) : (
        <Table.ScrollContainer minWidth={640}>
          <Table striped verticalSpacing="xs">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>E-mail</Table.Th>
                <Table.Th>Role</Table.Th>
                <Table.Th>Status</Table.Th>
                <Table.Th>Invited by</Table.Th>
                <Table.Th>Expires</Table.Th>
                <Table.Th />
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {(list.data?.items ?? []).map((i) => (
                <Table.Tr key={i.id}>
                  <Table.Td>{i.email}</Table.Td>
                  <Table.Td>{i.role}</Table.Td>
                  <Table.Td>
                    <StateBadge kind="invitation" state={i.status} />
                  </Table.Td>
                  <Table.Td>
                    <Text fz="xs">{i.invitedBy?.name ?? '—'}</Text>
                  </Table.Td>
                  <Table.Td>
                    <Text fz="xs">
                      {i.status === 'accepted'
                        ? `accepted ${formatDateTime(i.acceptedAt)}`
                        : formatDateTime(i.expiresAt)}
                    </Text>
                  </Table.Td>
                  <Table.Td>
                    {i.status === 'pending' ? (
                      <Button size="xs" variant="subtle" color="red" onClick={() => revoke.mutate(i.id)}>
                        Withdraw
                      </Button>
                    ) : null}
                  </Table.Td>
                </Table.Tr>
              ))}
            </Table.Tbody>
          </Table>
        </Table.ScrollContainer>
      )}
      {list.data && list.data.total > list.data.pageSize ? (
        <Pagination mt="sm" total={Math.ceil(list.data.total / list.data.pageSize)} value={page} onChange={setPage} />
      ) : null}
    </>
  );
}
