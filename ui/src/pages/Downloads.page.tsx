import { Alert, Anchor, Button, Group, Loader, Pagination, Stack, Table, Text, TextInput } from '@mantine/core';
import { useDebouncedValue } from '@mantine/hooks';
import { IconArchive, IconDownload, IconSearch, IconShieldCheck, IconShieldX } from '@tabler/icons-react';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { useDownloadZip, type DownloadedFile } from '../api/downloads.js';
import { useArchivedSweeps, useSweep, type SweepSummary } from '../api/sweeps.js';
import { ArchiveDigest } from '../components/ExportActions/ArchiveDigest.js';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';
import { formatCount } from '../lib/format.js';
import { formatDateTime } from '../lib/formatDate.js';

const PAGE_SIZE = 25;

function ArchivedRow({ s }: { s: SweepSummary }) {
  // The catalogue summary has no digest; the sweep itself carries archive.sha256.
  const detail = useSweep(s.id);
  const archive = detail.data?.archive;
  const [got, setGot] = useState<DownloadedFile | null>(null);
  const download = useDownloadZip(`/sweeps/${s.id}/export`, `sweep-${s.id}.zip`, { onSuccess: (f) => setGot(f) });
  const archivedAt = archive?.archivedAt ?? s.archivedAt ?? null;
  const verified = got?.sha256 && archive ? got.sha256 === archive.sha256 : null;
  return (
    <Table.Tr data-testid={`download-row-${s.id}`}>
      <Table.Td>
        <Anchor component={Link} to={`/sweeps/${s.id}`}>
          {s.name}
        </Anchor>
        <Text size="xs" c="dimmed">
          {s.model} · {formatCount(s.points)} points · {s.owner.name}
        </Text>
      </Table.Td>
      <Table.Td style={{ whiteSpace: 'nowrap' }}>{formatDateTime(archivedAt)}</Table.Td>
      <Table.Td>
        {archive ? (
          <ArchiveDigest sha256={archive.sha256} bytes={archive.bytes} />
        ) : detail.isLoading ? (
          <Loader size="xs" />
        ) : (
          '—'
        )}
      </Table.Td>
      <Table.Td>
        <Stack gap={4} align="flex-start">
          <Button
            size="xs"
            leftSection={<IconDownload size={14} />}
            onClick={() => download.mutate()}
            loading={download.isPending}
            data-testid="download-archive"
          >
            Download
          </Button>
          {got ? (
            <Group gap={4} wrap="nowrap" data-testid="download-verified">
              {verified === false ? <IconShieldX size={14} aria-hidden /> : <IconShieldCheck size={14} aria-hidden />}
              <Text size="xs">
                {verified === true
                  ? 'SHA-256 matches'
                  : verified === false
                    ? 'SHA-256 differs: download again'
                    : `Saved ${got.fileName}`}
              </Text>
            </Group>
          ) : null}
          {download.error ? (
            <Text size="xs" c="red">
              {(download.error as Error).message}
            </Text>
          ) : null}
        </Stack>
      </Table.Td>
    </Table.Tr>
  );
}

/** A reviewer's list of archived sweeps: frozen zips with their SHA-256, ready to download and check. */
export default function DownloadsPage() {
  const [page, setPage] = useState(1);
  const [text, setText] = useState('');
  const [q] = useDebouncedValue(text.trim(), 300);
  const query = { page, pageSize: PAGE_SIZE, ...(q ? { q } : {}) };
  const list = useArchivedSweeps(query);
  const items = list.data?.items ?? [];
  return (
    <>
      <PageHeader
        title="Downloads"
        description="Archived sweeps: each is a frozen zipped CSV with a manifest; the SHA-256 lets you check the file you received."
      />
      {list.isSuccess && list.data.total === 0 && !q ? (
        <EmptyState
          icon={IconArchive}
          title="No archived sweeps yet"
          actions={
            <Button component={Link} to="/catalogue" variant="light">
              Open the catalogue
            </Button>
          }
        >
          When a researcher archives a completed sweep it appears here with the SHA-256 of its export. Sweeps shared
          with you that are not archived are in the catalogue.
        </EmptyState>
      ) : (
        <Stack gap="sm">
          <TextInput
            leftSection={<IconSearch size={16} />}
            placeholder="Search archived sweeps"
            value={text}
            onChange={(e) => {
              setText(e.currentTarget.value);
              setPage(1);
            }}
            maw={360}
            aria-label="Search archived sweeps"
          />
          {list.isError ? <Alert color="red">{(list.error as Error).message}</Alert> : null}
          <Table withTableBorder fz="sm" data-testid="downloads-table">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Sweep</Table.Th>
                <Table.Th>Archived</Table.Th>
                <Table.Th>Export</Table.Th>
                <Table.Th />
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {items.map((s) => (
                <ArchivedRow key={s.id} s={s} />
              ))}
              {list.isSuccess && items.length === 0 ? (
                <Table.Tr>
                  <Table.Td colSpan={4}>
                    <Text size="sm" c="dimmed" ta="center" py="md">
                      No archived sweep matches “{q}”.
                    </Text>
                  </Table.Td>
                </Table.Tr>
              ) : null}
            </Table.Tbody>
          </Table>
          {list.data && list.data.total > PAGE_SIZE ? (
            <Pagination value={page} onChange={setPage} total={Math.ceil(list.data.total / PAGE_SIZE)} />
          ) : null}
        </Stack>
      )}
    </>
  );
}
