import { Alert, Button, Group, Pagination, Paper, Select, Table, Text, TextInput } from '@mantine/core';
import { useForm } from '@mantine/form';
import { zod4Resolver } from 'mantine-form-zod-resolver';
import { useState } from 'react';
import { invitationRequestSchema } from '@driftgrid/domain';
import { ApiError } from '../../api/client.js';
import { useInvitations, useInvite, useRevokeInvitation } from '../../api/admin.js';
import type { Role } from '../../auth/session.js';
import { ROLES } from '../AdminShared/labels.js';
import { formatDateTime } from '../../lib/formatDate.js';
import { ctrlEnter } from '../AdminShared/ctrlEnter.js';
import { StateBadge } from '../StatusBadge/StateBadge.js';

type Values = { email: string; role: Role };

const checkInvite = zod4Resolver(invitationRequestSchema);

/** Invite by e-mail with a role (the link is valid 7 days, once), and the list of invitations. */
export function AdminInvitations() {
  const form = useForm<Values>({
    mode: 'controlled',
    initialValues: { email: '', role: 'researcher' },
    validate: (v) => checkInvite(v) as Record<string, string>,
    // Errors appear once a field was left or the form submitted, never before anything is typed.
    validateInputOnBlur: true,
  });
  const [formError, setFormError] = useState<string | null>(null);
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
      form.setFieldValue('email', '');
      form.resetTouched();
    },
    onError: (err) => {
      if (err instanceof ApiError && (err.detailFor('email') || err.detailFor('role'))) {
        form.setErrors({ email: err.detailFor('email'), role: err.detailFor('role') });
        setFormError(null);
      } else setFormError(err instanceof ApiError ? err.message : 'The invitation could not be sent');
    },
  });
  const revoke = useRevokeInvitation();

  const submit = form.onSubmit(
    (v) => {
      setSent(null);
      setFormError(null);
      // Validated: parse only applies the schema's trimming and lower-casing.
      invite.mutate(invitationRequestSchema.parse(v));
    },
    () => setSent(null),
  );

  return (
    <>
      <Paper
        withBorder
        p="md"
        mb="md"
        component="form"
        onSubmit={submit}
        onKeyDown={ctrlEnter(() => submit())}
        noValidate
        aria-label="Invite someone"
      >
        <Group align="flex-start" gap="sm" wrap="wrap">
          <TextInput
            label="E-mail address"
            placeholder="colleague@university.example"
            {...form.getInputProps('email')}
            w={300}
            required
          />
          <Select
            label="Role"
            data={ROLES.map((r) => ({ value: r, label: r }))}
            {...form.getInputProps('role')}
            allowDeselect={false}
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
        {formError ? (
          <Alert color="red" mt="sm">
            {formError}
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
