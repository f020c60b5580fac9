import { Alert, Button, Group, NumberInput, Paper, Select, SimpleGrid, Table, Text, Title } from '@mantine/core';
import { useEffect, useState } from 'react';
import { QUOTA_KEYS, type Quota, type QuotaKey } from '@driftgrid/domain';
import { ApiError } from '../../api/client.js';
import { useAdminUsers, usePutRoleQuota, usePutUserQuota, useQuotas } from '../../api/admin.js';
import type { Role } from '../../auth/session.js';
import { formatCount } from '../../lib/format.js';
import { QUOTA_LABELS, ROLES } from '../AdminShared/labels.js';
import { ctrlEnter } from '../AdminShared/ctrlEnter.js';

type Draft = Partial<Record<QuotaKey, number | ''>>;

function errorsOf(err: unknown): Partial<Record<QuotaKey | 'form', string>> {
  if (!(err instanceof ApiError)) return { form: 'The change could not be saved' };
  const out: Partial<Record<QuotaKey | 'form', string>> = {};
  for (const k of QUOTA_KEYS) out[k] = err.detailFor(k);
  if (!QUOTA_KEYS.some((k) => out[k])) out.form = err.message;
  return out;
}

function QuotaFields({
  draft,
  setDraft,
  errors,
  placeholder,
}: {
  draft: Draft;
  setDraft: (d: Draft) => void;
  errors: Partial<Record<string, string>>;
  placeholder?: Partial<Quota>;
}) {
  return (
    <SimpleGrid cols={{ base: 1, sm: 2, lg: 4 }}>
      {QUOTA_KEYS.map((k) => (
        <NumberInput
          key={k}
          label={QUOTA_LABELS[k].label}
          rightSection={
            <Text fz="xs" c="dimmed" pr={6}>
              {QUOTA_LABELS[k].unit}
            </Text>
          }
          rightSectionWidth={60}
          thousandSeparator=","
          min={0}
          allowDecimal={false}
          value={draft[k] ?? ''}
          placeholder={placeholder?.[k] !== undefined ? `role default ${formatCount(placeholder[k]!)}` : undefined}
          onChange={(v) => setDraft({ ...draft, [k]: typeof v === 'number' ? v : '' })}
          error={errors[k]}
        />
      ))}
    </SimpleGrid>
  );
}

function RoleDefaultForm({ role, quota }: { role: Role; quota: Quota }) {
  const [draft, setDraft] = useState<Draft>(quota);
  const [errors, setErrors] = useState<Partial<Record<string, string>>>({});
  useEffect(() => setDraft(quota), [quota]);
  const save = usePutRoleQuota(role, {
    onMutate: () => setErrors({}),
    onError: (e) => setErrors(errorsOf(e)),
  });
  const saveDraft = () => {
    const patch: Partial<Quota> = {};
    for (const k of QUOTA_KEYS) if (draft[k] !== '' && draft[k] !== undefined) patch[k] = draft[k] as number;
    save.mutate(patch);
  };
  return (
    <Paper
      withBorder
      p="md"
      component="form"
      onSubmit={(e) => {
        e.preventDefault();
        saveDraft();
      }}
      onKeyDown={ctrlEnter(() => saveDraft())}
      aria-label={`Quota defaults for ${role}`}
    >
      <Group justify="space-between" mb="xs">
        <Title order={3} fz="h5" tt="capitalize">
          {role}
        </Title>
        <Button type="submit" size="xs" loading={save.isPending}>
          Save {role} defaults
        </Button>
      </Group>
      {role === 'reviewer' ? (
        <Text fz="xs" c="dimmed" mb="xs">
          Reviewers cannot create sweeps whatever these numbers say; keep them at 0.
        </Text>
      ) : null}
      <QuotaFields draft={draft} setDraft={setDraft} errors={errors} />
      {errors.form ? (
        <Alert color="red" mt="sm">
          {errors.form}
        </Alert>
      ) : null}
    </Paper>
  );
}

function UserOverrideForm({ defaults }: { defaults: Record<Role, Quota> }) {
  const users = useAdminUsers({ pageSize: 1000 });
  const doc = useQuotas();
  const [userId, setUserId] = useState<string | null>(null);
  const [draft, setDraft] = useState<Draft>({});
  const [errors, setErrors] = useState<Partial<Record<string, string>>>({});
  const user = users.data?.items.find((u) => String(u.id) === userId);
  useEffect(() => {
    const o = doc.data?.overrides.find((x) => String(x.userId) === userId);
    setDraft(Object.fromEntries(QUOTA_KEYS.map((k) => [k, o?.[k] ?? ''])) as Draft);
  }, [userId, doc.data]);
  const save = usePutUserQuota({
    onMutate: () => setErrors({}),
    onError: (e) => setErrors(errorsOf(e)),
  });
  const saveDraft = () => {
    // An empty field clears the override for that limit (back to the role default).
    const patch = Object.fromEntries(
      QUOTA_KEYS.map((k) => [k, draft[k] === '' || draft[k] === undefined ? null : draft[k]]),
    );
    save.mutate({ userId: Number(userId), patch });
  };
  const submit = () => {
    if (userId) saveDraft();
    else setErrors({ user: 'Choose a user first' });
  };
  return (
    <Paper
      withBorder
      p="md"
      component="form"
      onSubmit={(e) => {
        e.preventDefault();
        submit();
      }}
      onKeyDown={ctrlEnter(submit)}
      aria-label="Per-user override"
    >
      <Title order={3} fz="h5" mb="xs">
        Per-user override
      </Title>
      <Select
        label="User"
        searchable
        placeholder="Pick a user"
        data={(users.data?.items ?? []).map((u) => ({
          value: String(u.id),
          label: `${u.name} <${u.email}> (${u.role})`,
        }))}
        value={userId}
        onChange={setUserId}
        error={errors.user}
        mb="sm"
        maw={480}
      />
      <QuotaFields
        draft={draft}
        setDraft={setDraft}
        errors={errors}
        placeholder={user ? defaults[user.role] : undefined}
      />
      <Text fz="xs" c="dimmed" mt="xs">
        Leave a field empty to use the role default. Lowering a limit never deletes data; it only refuses new sweeps.
      </Text>
      <Button type="submit" mt="sm" loading={save.isPending} disabled={!userId}>
        Save override
      </Button>
      {errors.form ? (
        <Alert color="red" mt="sm">
          {errors.form}
        </Alert>
      ) : null}
    </Paper>
  );
}

/** Role defaults, per-user overrides, and the list of overrides in force. */
export function AdminQuotas() {
  const doc = useQuotas();
  const clear = usePutUserQuota();
  const clearOverride = (id: number) =>
    clear.mutate({ userId: id, patch: Object.fromEntries(QUOTA_KEYS.map((k) => [k, null])) });
  if (doc.error) return <Alert color="red">{doc.error.message}</Alert>;
  if (!doc.data)
    return (
      <Text c="dimmed" fz="sm">
        Loading quotas…
      </Text>
    );
  const show = (v: number | null) =>
    v === null ? (
      <Text span c="dimmed" fz="xs">
        role default
      </Text>
    ) : (
      formatCount(v)
    );
  return (
    <>
      <Title order={2} fz="h4" mb="sm">
        Role defaults
      </Title>
      <SimpleGrid cols={1} spacing="sm" mb="lg">
        {ROLES.map((r) => (
          <RoleDefaultForm key={r} role={r} quota={doc.data.defaults[r]} />
        ))}
      </SimpleGrid>
      <UserOverrideForm defaults={doc.data.defaults} />
      <Title order={2} fz="h4" mt="lg" mb="sm">
        Overrides in force
      </Title>
      {doc.data.overrides.length === 0 ? (
        <Text c="dimmed" fz="sm">
          No user has an override; everyone has their role’s defaults.
        </Text>
      ) : (
        <Table.ScrollContainer minWidth={720}>
          <Table striped>
            <Table.Thead>
              <Table.Tr>
                <Table.Th>User</Table.Th>
                {QUOTA_KEYS.map((k) => (
                  <Table.Th key={k}>{QUOTA_LABELS[k].label}</Table.Th>
                ))}
                <Table.Th />
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {doc.data.overrides.map((o) => (
                <Table.Tr key={o.userId}>
                  <Table.Td>
                    <Text fz="sm">{o.name}</Text>
                    <Text fz="xs" c="dimmed">
                      {o.email} · {o.role}
                    </Text>
                  </Table.Td>
                  {QUOTA_KEYS.map((k) => (
                    <Table.Td key={k}>{show(o[k])}</Table.Td>
                  ))}
                  <Table.Td>
                    <Button size="xs" variant="subtle" onClick={() => clearOverride(o.userId)}>
                      Clear
                    </Button>
                  </Table.Td>
                </Table.Tr>
              ))}
            </Table.Tbody>
          </Table>
        </Table.ScrollContainer>
      )}
    </>
  );
}
