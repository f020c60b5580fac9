import { Anchor, Badge, Button, Group, Modal, Pagination, Stack, Table, Text, TextInput } from '@mantine/core';
import { useDebouncedValue } from '@mantine/hooks';
import { IconDatabase, IconSearch, IconUpload } from '@tabler/icons-react';
import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { DatasetUpload } from '../components/DatasetUpload/DatasetUpload.js';
import { useDatasetList } from '../api/datasets.js';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';
import { formatCount, prettyUnit } from '../lib/format.js';
import { formatDateTime } from '../lib/formatDate.js';

const PAGE_SIZE = 25;

export default function DatasetsPage() {
  const navigate = useNavigate();
  const [uploading, setUploading] = useState(false);
  const [page, setPage] = useState(1);
  const [text, setText] = useState('');
  const [q] = useDebouncedValue(text.trim(), 300);
  const list = useDatasetList({ page, pageSize: PAGE_SIZE, ...(q ? { q } : {}) });
  const items = list.data?.items ?? [];
  const empty = list.isSuccess && list.data.total === 0 && !q;

  const uploadButton = (
    <Button leftSection={<IconUpload size={16} />} onClick={() => setUploading(true)} data-testid="dataset-upload-open">
      Upload a CSV
    </Button>
  );

  return (
    <>
      <PageHeader
        title="Datasets"
        description="Measured data uploaded as CSV, with a unit for every column; a source for fits and plot overlays."
        actions={empty ? undefined : uploadButton}
      />
      {empty ? (
        <EmptyState icon={IconDatabase} title="No datasets uploaded yet" actions={uploadButton}>
          Upload a CSV with a header row (for example probe potential in V and density in cm⁻³), give each column its
          unit, and the rows become a source for fits beside sweep results. Rows that do not parse are reported with
          their line and column; nothing is stored from a rejected file.
        </EmptyState>
      ) : (
        <Stack gap="sm">
          <TextInput
            leftSection={<IconSearch size={16} />}
            placeholder="Search by name or file name"
            value={text}
            onChange={(e) => {
              setText(e.currentTarget.value);
              setPage(1);
            }}
            maw={360}
            aria-label="Search datasets"
          />
          <Table striped highlightOnHover withTableBorder fz="sm" data-testid="datasets-table">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Name</Table.Th>
                <Table.Th style={{ textAlign: 'right' }}>Rows</Table.Th>
                <Table.Th>Columns (canonical units)</Table.Th>
                <Table.Th>Owner</Table.Th>
                <Table.Th>Visibility</Table.Th>
                <Table.Th>Uploaded</Table.Th>
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {items.map((d) => (
                <Table.Tr key={d.id}>
                  <Table.Td>
                    <Anchor component={Link} to={`/datasets/${d.id}`}>
                      {d.name}
                    </Anchor>
                    {d.fileName ? (
                      <Text size="xs" c="dimmed">
                        {d.fileName}
                      </Text>
                    ) : null}
                  </Table.Td>
                  <Table.Td style={{ textAlign: 'right', fontVariantNumeric: 'tabular-nums' }}>
                    {formatCount(d.rows)}
                  </Table.Td>
                  <Table.Td>
                    <Group gap={4}>
                      {d.columns.map((c) => (
                        <Badge key={c.name} variant="light" color={c.kind === 'number' ? 'tide' : 'gray'} tt="none">
                          {c.name}
                          {c.kind === 'number' && c.canonicalUnit && c.canonicalUnit !== '1'
                            ? ` [${prettyUnit(c.canonicalUnit)}]`
                            : c.kind === 'text'
                              ? ' (text)'
                              : ''}
                        </Badge>
                      ))}
                    </Group>
                  </Table.Td>
                  <Table.Td>{d.owner.name}</Table.Td>
                  <Table.Td>
                    {d.visibility === 'group'
                      ? 'Group'
                      : d.sharedWith.length
                        ? `Shared with ${d.sharedWith.length}`
                        : 'Private'}
                  </Table.Td>
                  <Table.Td>{formatDateTime(d.createdAt)}</Table.Td>
                </Table.Tr>
              ))}
              {list.isSuccess && items.length === 0 ? (
                <Table.Tr>
                  <Table.Td colSpan={6}>
                    <Text size="sm" c="dimmed" ta="center" py="md">
                      No dataset matches “{q}”.
                    </Text>
                  </Table.Td>
                </Table.Tr>
              ) : null}
            </Table.Tbody>
          </Table>
          {list.data && list.data.total > PAGE_SIZE ? (
            <Pagination value={page} onChange={setPage} total={Math.ceil(list.data.total / PAGE_SIZE)} />
          ) : null}
          {list.isError ? (
            <Text c="red" size="sm">
              {(list.error as Error).message}
            </Text>
          ) : null}
        </Stack>
      )}
      <Modal opened={uploading} onClose={() => setUploading(false)} title="Upload a dataset" size="xl">
        <DatasetUpload
          onCancel={() => setUploading(false)}
          onUploaded={(r) => {
            setUploading(false);
            void navigate(`/datasets/${r.id}`);
          }}
        />
      </Modal>
    </>
  );
}
