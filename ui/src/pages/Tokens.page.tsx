import { Alert, Button, CopyButton, Group, Paper, Select, Table, Text, TextInput, Code } from '@mantine/core';
import { IconCheck, IconCopy, IconKey } from '@tabler/icons-react';
import { useState, type FormEvent } from 'react';
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

function state(t: ApiTokenSummary): 'active' | 'expired' | 'revoked' {
  if (t.revokedAt) return 'revoked';
  if (t.expiresAt !== null && t.expiresAt <= Date.now()) return 'expired';
  return 'active';
}

/** Personal API tokens: create (secret shown once, with a copy button), list and revoke. */
export default function TokensPage() {
  const list = useTokens();
  const [name, setName] = useState('');
  const [scope, setScope] = useState<'read' | 'read-write'>('read');
  const [expiry, setExpiry] = useState('90');
  const [errors, setErrors] = useState<{ name?: string; scope?: string; expiresAt?: string; form?: string }>({});
  const [created, setCreated] = useState<CreatedApiToken | null>(null);
  const create = useCreateToken({
    onSuccess: (t) => {
      setCreated(t);
      setName('');
    },
    onError: (err) => {
      if (err instanceof ApiError)
        setErrors({
          name: err.detailFor('name'),
          scope: err.detailFor('scope'),
          expiresAt: err.detailFor('expiresAt'),
          form: err.details.length ? undefined : err.message,
        });
      else setErrors({ form: 'The token could not be created' });
    },
  });
  const revoke = useRevokeToken();

  const submit = () => {
    if (!name.trim()) return setErrors({ name: 'Give the token a name, e.g. the script or machine that uses it' });
    setErrors({});
    setCreated(null);
    create.mutate({
      name: name.trim(),
      scope,
      expiresAt: expiry === 'never' ? null : new Date(Date.now() + Number(expiry) * 86_400_000).toISOString(),
    });
  };
  const onSubmit = (e: FormEvent) => {
    e.preventDefault();
    submit();
  };
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
        onSubmit={onSubmit}
        onKeyDown={ctrlEnter(submit)}
        noValidate
        aria-label="Create a token"
      >
        <Group align="flex-start" gap="sm" wrap="wrap">
          <TextInput
            label="Name"
            placeholder="analysis notebook"
            value={name}
            onChange={(e) => setName(e.currentTarget.value)}
            error={errors.name}
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
            value={scope}
            onChange={(v) => v && setScope(v as 'read' | 'read-write')}
            allowDeselect={false}
            error={errors.scope}
            w={170}
          />
          <Select
            label="Expires after"
            data={EXPIRY}
            value={expiry}
            onChange={(v) => v && setExpiry(v)}
            allowDeselect={false}
            error={errors.expiresAt}
            w={150}
          />
          <Button type="submit" mt={25} loading={create.isPending} leftSection={<IconKey size={16} />}>
            Create token
          </Button>
        </Group>
        <Text fz="xs" c="dimmed" mt="xs">
          Read-only tokens can list, read and download; read-and-write tokens can also submit and change work.
          Ctrl+Enter creates.
        </Text>
        {errors.form ? (
          <Alert color="red" mt="sm">
            {errors.form}
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
