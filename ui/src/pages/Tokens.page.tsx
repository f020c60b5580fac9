import { Alert, Button, CopyButton, Group, Paper, Select, Table, Text, TextInput, Code } from '@mantine/core';
import { IconCheck, IconCopy, IconKey } from '@tabler/icons-react';
import { useForm } from '@mantine/form';
import { zod4Resolver } from 'mantine-form-zod-resolver';
import { useState } from 'react';
import { createTokenSchema, type TokenScope } from '@driftgrid/domain';
import { ApiError } from '../api/client.js';
import {
  useCreateToken,
  useRevokeToken,
  useTokens,
  type ApiTokenSummary,
  type CreatedApiToken,
} from '../api/tokens.js';
import { formatDateTime } from '../lib/formatDate.js';
import { StateBadge } from '../components/StatusBadge/StateBadge.js';
import { ctrlEnter } from '../components/AdminShared/ctrlEnter.js';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

const EXPIRY = [
  { value: '30', label: '30 days' },
  { value: '90', label: '90 days' },
  { value: '365', label: '1 year' },
  { value: 'never', label: 'Never' },
];

type Values = { name: string; scope: TokenScope; expiry: string };

/** The request the form stands for: the expiry choice becomes an ISO date-time (or null for never). */
function requestOf(v: Values): { name: string; scope: TokenScope; expiresAt: string | null } {
  return {
    name: v.name.trim(),
    scope: v.scope,
    expiresAt: v.expiry === 'never' ? null : new Date(Date.now() + Number(v.expiry) * 86_400_000).toISOString(),
  };
}

const checkRequest = zod4Resolver(createTokenSchema);

/** The domain's token schema; its expiresAt error shows beside "Expires after", an empty name in the user's words. */
function validate(v: Values): Record<string, string> {
  const { expiresAt, ...errors } = checkRequest(requestOf(v)) as Record<string, string>;
  if (expiresAt) errors.expiry = expiresAt;
  if (!v.name.trim()) errors.name = 'Give the token a name, e.g. the script or machine that uses it';
  return errors;
}

function state(t: ApiTokenSummary): 'active' | 'expired' | 'revoked' {
  if (t.revokedAt) return 'revoked';
  if (t.expiresAt !== null && t.expiresAt <= Date.now()) return 'expired';
  return 'active';
}

/** Personal API tokens: create (secret shown once, with a copy button), list and revoke. */
export default function TokensPage() {
  const list = useTokens();
  const form = useForm<Values>({
    mode: 'controlled',
    initialValues: { name: '', scope: 'read', expiry: '90' },
    validate,
    // Errors appear once a field was left or the form submitted, never before anything is typed.
    validateInputOnBlur: true,
  });
  const [formError, setFormError] = useState<string | null>(null);
  const [created, setCreated] = useState<CreatedApiToken | null>(null);
  const create = useCreateToken({
    onSuccess: (t) => {
      setCreated(t);
      form.setFieldValue('name', '');
      form.resetTouched();
    },
    onError: (err) => {
      if (err instanceof ApiError && err.details.length) {
        form.setErrors({
          name: err.detailFor('name'),
          scope: err.detailFor('scope'),
          expiry: err.detailFor('expiresAt'),
        });
        setFormError(null);
      } else setFormError(err instanceof ApiError ? err.message : 'The token could not be created');
    },
  });
  const revoke = useRevokeToken();

  const submit = form.onSubmit((v) => {
    setFormError(null);
    setCreated(null);
    create.mutate(requestOf(v));
  });
  const items = list.data?.items ?? [];

  return (
    <>
      <PageHeader
        title="API tokens"
        description="Personal tokens for scripts and notebooks that call the Driftgrid API as you."
      />
      <Paper
        withBorder
        p="md"
        mb="md"
        component="form"
        onSubmit={submit}
        onKeyDown={ctrlEnter(() => submit())}
        noValidate
        aria-label="Create a token"
      >
        <Group align="flex-start" gap="sm" wrap="wrap">
          <TextInput
            label="Name"
            placeholder="analysis notebook"
            {...form.getInputProps('name')}
            w={260}
            maxLength={80}
            required
          />
          <Select
            label="Scope"
            data={[
              { value: 'read', label: 'Read only' },
              { value: 'read-write', label: 'Read and write' },
            ]}
            {...form.getInputProps('scope')}
            allowDeselect={false}
            w={170}
          />
          <Select label="Expires after" data={EXPIRY} {...form.getInputProps('expiry')} allowDeselect={false} w={150} />
          <Button type="submit" mt={25} loading={create.isPending} leftSection={<IconKey size={16} />}>
            Create token
          </Button>
        </Group>
        <Text fz="xs" c="dimmed" mt="xs">
          Read-only tokens can list, read and download; read-and-write tokens can also submit and change work.
          Ctrl+Enter creates.
        </Text>
        {formError ? (
          <Alert color="red" mt="sm">
            {formError}
          </Alert>
        ) : null}
      </Paper>
      {created ? (
        <Alert color="green" mb="md" title={`Token “${created.name}” created — copy it now`} data-testid="token-secret">
          <Text fz="sm" mb="xs">
            This is the only time the secret is shown. Store it like a password.
          </Text>
          <Group gap="xs" wrap="nowrap">
            <Code style={{ wordBreak: 'break-all' }}>{created.token}</Code>
            <CopyButton value={created.token}>
              {({ copied, copy }) => (
                <Button
                  size="xs"
                  variant="light"
                  onClick={copy}
                  leftSection={copied ? <IconCheck size={14} /> : <IconCopy size={14} />}
                >
                  {copied ? 'Copied' : 'Copy'}
                </Button>
              )}
            </CopyButton>
          </Group>
          <Text fz="xs" mt="xs">
            Use it as <Code>Authorization: Bearer {created.prefix}…</Code>
          </Text>
        </Alert>
      ) : null}
      {list.error ? <Alert color="red">{list.error.message}</Alert> : null}
      {list.data && items.length === 0 ? (
        <EmptyState icon={IconKey} title="No tokens yet">
          Create a named token above for each script or machine; revoke it when it is no longer needed. Scripts send it
          as a Bearer token.
        </EmptyState>
      ) : (
        <Table.ScrollContainer minWidth={640}>
          <Table striped verticalSpacing="xs">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Name</Table.Th>
                <Table.Th>Scope</Table.Th>
                <Table.Th>State</Table.Th>
                <Table.Th>Created</Table.Th>
                <Table.Th>Expires</Table.Th>
                <Table.Th>Last used</Table.Th>
                <Table.Th />
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {items.map((t) => {
                const s = state(t);
                return (
                  <Table.Tr key={t.id}>
                    <Table.Td>
                      <Text fz="sm">{t.name}</Text>
                      <Text fz="xs" c="dimmed" ff="monospace">
                        {t.prefix}…
                      </Text>
                    </Table.Td>
                    <Table.Td>{t.scope === 'read' ? 'read only' : 'read and write'}</Table.Td>
                    <Table.Td>
                      <StateBadge kind="token" state={s} />
                    </Table.Td>
                    <Table.Td>
                      <Text fz="xs">{formatDateTime(t.createdAt)}</Text>
                    </Table.Td>
                    <Table.Td>
                      <Text fz="xs">{t.expiresAt === null ? 'never' : formatDateTime(t.expiresAt)}</Text>
                    </Table.Td>
                    <Table.Td>
                      <Text fz="xs">{t.lastUsedAt === null ? 'never' : formatDateTime(t.lastUsedAt)}</Text>
                    </Table.Td>
                    <Table.Td>
                      {s === 'active' ? (
                        <Button
                          size="xs"
                          variant="subtle"
                          color="red"
                          onClick={() => revoke.mutate(t.id)}
                          loading={revoke.isPending && revoke.variables === t.id}
                        >
                          Revoke
                        </Button>
                      ) : null}
                    </Table.Td>
                  </Table.Tr>
                );
              })}
            </Table.Tbody>
          </Table>
        </Table.ScrollContainer>
      )}
    </>
  );
}
