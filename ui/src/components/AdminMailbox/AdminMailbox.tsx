import {
  Alert,
  Grid,
  Pagination,
  Paper,
  ScrollArea,
  SegmentedControl,
  Stack,
  Text,
  Title,
  UnstyledButton,
} from '@mantine/core';
import { useState } from 'react';
import { useMail, useMailbox } from '../../api/admin.js';
import { formatDateTime } from '../../lib/formatDate.js';

function MessageView({ id }: { id: number }) {
  const [mode, setMode] = useState<'text' | 'html'>('text');
  const m = useMail(id);
  if (m.error) return <Alert color="red">{m.error.message}</Alert>;
  if (!m.data)
    return (
      <Text c="dimmed" fz="sm">
        Loading…
      </Text>
    );
  return (
    <Stack gap="xs">
      <Title order={3} fz="h5">
        {m.data.subject || '(no subject)'}
      </Title>
      <Text fz="xs" c="dimmed">
        From {m.data.from} · to {m.data.to} · {formatDateTime(m.data.receivedAt)}
      </Text>
      {m.data.html ? (
        <SegmentedControl
          size="xs"
          value={mode}
          onChange={(v) => setMode(v as 'text' | 'html')}
          data={[
            { value: 'text', label: 'Plain text' },
            { value: 'html', label: 'HTML' },
          ]}
          w={200}
        />
      ) : null}
      {mode === 'html' && m.data.html ? (
        // sandbox without allow-scripts: the message's HTML cannot run code or reach the app.
        <iframe
          title="Message as HTML"
          sandbox=""
          srcDoc={m.data.html}
          style={{ width: '100%', minHeight: 420, border: '1px solid var(--mantine-color-default-border)' }}
        />
      ) : (
        <Paper withBorder p="sm">
          <Text component="pre" fz="sm" style={{ whiteSpace: 'pre-wrap', margin: 0, fontFamily: 'inherit' }}>
            {m.data.text}
          </Text>
        </Paper>
      )}
    </Stack>
  );
}

/** The built-in mailbox: mail the server sent while no SMTP relay is configured. */
export function AdminMailbox() {
  const [page, setPage] = useState(1);
  const [open, setOpen] = useState<number | null>(null);
  const list = useMailbox(page);
  if (list.error) return <Alert color="red">{list.error.message}</Alert>;
  if (!list.data)
    return (
      <Text c="dimmed" fz="sm">
        Loading the mailbox…
      </Text>
    );
  if (list.data.items.length === 0) {
    return (
      <Text c="dimmed" fz="sm" ta="center" py="lg">
        {list.data.builtIn === false
          ? 'Mail goes to the configured SMTP relay (SMTP_URL), so nothing is kept here.'
          : 'No mail yet. Invitations and password-reset messages appear here while no SMTP relay is configured.'}
      </Text>
    );
  }
  return (
    <Grid>
      <Grid.Col span={{ base: 12, md: 5 }}>
        <ScrollArea.Autosize mah={560}>
          <Stack gap={4}>
            {list.data.items.map((m) => (
              <UnstyledButton
                key={m.id}
                onClick={() => setOpen(m.id)}
                p="xs"
                style={{
                  borderRadius: 4,
                  background: open === m.id ? 'var(--mantine-color-default-hover)' : undefined,
                }}
                aria-pressed={open === m.id}
              >
                <Text fz="sm" fw={500} lineClamp={1}>
                  {m.subject || '(no subject)'}
                </Text>
                <Text fz="xs" c="dimmed">
                  to {m.to} · {formatDateTime(m.receivedAt)}
                </Text>
              </UnstyledButton>
            ))}
          </Stack>
        </ScrollArea.Autosize>
        {list.data.total > list.data.pageSize ? (
          <Pagination
            mt="sm"
            size="sm"
            total={Math.ceil(list.data.total / list.data.pageSize)}
            value={page}
            onChange={setPage}
          />
        ) : null}
      </Grid.Col>
      <Grid.Col span={{ base: 12, md: 7 }}>
        {open ? (
          <MessageView id={open} />
        ) : (
          <Text c="dimmed" fz="sm">
            Choose a message to read it.
          </Text>
        )}
      </Grid.Col>
    </Grid>
  );
}
