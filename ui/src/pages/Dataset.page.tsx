import { Alert, Button, Group, Loader, Modal, Pagination, ScrollArea, Stack, Table, Tabs, Text } from '@mantine/core';
import { IconDownload, IconTrash } from '@tabler/icons-react';
import { lazy, Suspense, useState } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { useMe } from '../api/auth.js';
import { ApiError } from '../api/client.js';
import { useDataset, useDatasetRows, useDeleteDataset } from '../api/datasets.js';
import { useDownloadZip } from '../api/downloads.js';
import { ArchiveDigest } from '../components/ExportActions/ArchiveDigest.js';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { FitsPanel } from '../components/FitsPanel/FitsPanel.js';
import { Num } from '../components/Num/Num.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';
import { formatCount, prettyUnit } from '../lib/format.js';
import { IconDatabaseOff } from '@tabler/icons-react';
import { formatDateTime } from '../lib/formatDate.js';

const DatasetScatter = lazy(() => import('../components/DatasetUpload/DatasetScatter.js'));
const PAGE_SIZE = 50;

export default function DatasetPage() {
  const { id = '' } = useParams();
  const navigate = useNavigate();
  const { data: me } = useMe();
  const dataset = useDataset(id);
  const [page, setPage] = useState(1);
  const rows = useDatasetRows(id, page, PAGE_SIZE);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const remove = useDeleteDataset();
  const exportZip = useDownloadZip(`/datasets/${id}/export`, `dataset-${id}.zip`);

  if (dataset.isError) {
    const notFound = dataset.error instanceof ApiError && dataset.error.status === 404;
    return (
      <EmptyState
        icon={IconDatabaseOff}
        title={notFound ? 'Dataset not found' : 'Cannot load the dataset'}
        actions={<Button onClick={() => void navigate('/datasets')}>All datasets</Button>}
      >
        {notFound ? 'It does not exist, was deleted, or is not shared with you.' : (dataset.error as Error).message}
      </EmptyState>
    );
  }
  if (!dataset.data) return <Loader />;
  const d = dataset.data;
  const mayManage = !!me && (me.role === 'admin' || Number(me.id) === d.owner.id);
  // Fits read the stored (canonical) values, so the columns carry their canonical units.
  const fitColumns = d.columns
    .filter((c) => c.kind === 'number')
    .map((c) => ({ name: c.name, unit: c.canonicalUnit, kind: c.kind }));

  return (
    <>
      <PageHeader
        title={d.name}
        description={`${formatCount(d.rows)} rows · uploaded by ${d.owner.name} on ${formatDateTime(d.createdAt)}${d.fileName ? ` · ${d.fileName}` : ''}`}
        actions={
          <Group gap="xs">
            <Button
              leftSection={<IconDownload size={16} />}
              onClick={() => exportZip.mutate()}
              loading={exportZip.isPending}
              data-testid="dataset-export"
            >
              Download zipped CSV
            </Button>
            {mayManage ? (
              <Button
                variant="default"
                color="red"
                leftSection={<IconTrash size={16} />}
                onClick={() => setConfirmDelete(true)}
              >
                Delete
              </Button>
            ) : null}
          </Group>
        }
      />
      {exportZip.error ? (
        <Alert color="red" mb="sm">
          {(exportZip.error as Error).message}
        </Alert>
      ) : null}
      <Stack gap="xs" mb="md">
        <Text size="sm" c="dimmed">
          Numbers are stored and shown in canonical units (SI, temperatures in eV); the unit given at upload is kept
          beside it.
        </Text>
        <ArchiveDigest sha256={d.sha256} testId="dataset-sha256" />
      </Stack>
      <Tabs defaultValue="rows" keepMounted={false}>
        <Tabs.List>
          <Tabs.Tab value="rows">Rows</Tabs.Tab>
          <Tabs.Tab value="plot">Quick plot</Tabs.Tab>
          <Tabs.Tab value="fits">Fits</Tabs.Tab>
        </Tabs.List>
        <Tabs.Panel value="rows" pt="md">
          <ScrollArea>
            <Table striped withTableBorder fz="sm" data-testid="dataset-rows">
              <Table.Thead>
                <Table.Tr>
                  <Table.Th style={{ textAlign: 'right' }}>#</Table.Th>
                  {d.columns.map((c) => (
                    <Table.Th
                      key={c.name}
                      style={{ textAlign: c.kind === 'number' ? 'right' : 'left' }}
                      title={c.unit && c.unit !== c.canonicalUnit ? `uploaded in ${c.unit}` : undefined}
                    >
                      {c.name}
                      {c.kind === 'number' && prettyUnit(c.canonicalUnit) ? (
                        <Text span c="dimmed" fz="xs">{` [${prettyUnit(c.canonicalUnit)}]`}</Text>
                      ) : null}
                    </Table.Th>
                  ))}
                </Table.Tr>
              </Table.Thead>
              <Table.Tbody>
                {(rows.data?.items ?? []).map((r) => (
                  <Table.Tr key={r.row}>
                    <Table.Td style={{ textAlign: 'right', fontVariantNumeric: 'tabular-nums' }}>{r.row + 1}</Table.Td>
                    {d.columns.map((c, j) => (
                      <Table.Td key={c.name} style={{ textAlign: c.kind === 'number' ? 'right' : 'left' }}>
                        {c.kind === 'number' ? (
                          <Num value={r.cells[j] as number | null} align="right" />
                        ) : (
                          String(r.cells[j] ?? '')
                        )}
                      </Table.Td>
                    ))}
                  </Table.Tr>
                ))}
              </Table.Tbody>
            </Table>
          </ScrollArea>
          {d.rows > PAGE_SIZE ? (
            <Pagination mt="sm" value={page} onChange={setPage} total={Math.ceil(d.rows / PAGE_SIZE)} />
          ) : null}
        </Tabs.Panel>
        <Tabs.Panel value="plot" pt="md">
          <Suspense fallback={<Loader />}>
            <DatasetScatter datasetId={d.id} columns={d.columns} />
          </Suspense>
        </Tabs.Panel>
        <Tabs.Panel value="fits" pt="md">
          <FitsPanel source={{ kind: 'dataset', id: d.id }} columns={fitColumns} />
        </Tabs.Panel>
      </Tabs>
      <Modal opened={confirmDelete} onClose={() => setConfirmDelete(false)} title="Delete this dataset?" centered>
        <Stack gap="sm">
          <Text size="sm">
            Its {formatCount(d.rows)} rows are removed. Fits made from it keep their results but can no longer be
            re-run.
          </Text>
          {remove.error ? <Alert color="red">{(remove.error as Error).message}</Alert> : null}
          <Group justify="flex-end">
            <Button variant="default" onClick={() => setConfirmDelete(false)}>
              Keep it
            </Button>
            <Button
              color="red"
              loading={remove.isPending}
              onClick={() => remove.mutate(d.id, { onSuccess: () => void navigate('/datasets') })}
            >
              Delete
            </Button>
          </Group>
        </Stack>
      </Modal>
    </>
  );
}
