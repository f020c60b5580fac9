import '@mantine/dropzone/styles.css';
import {
  Alert,
  Badge,
  Button,
  Group,
  Paper,
  ScrollArea,
  SegmentedControl,
  Stack,
  Table,
  Text,
  TextInput,
} from '@mantine/core';
import { Dropzone } from '@mantine/dropzone';
import { IconAlertTriangle, IconFileSpreadsheet, IconUpload, IconX } from '@tabler/icons-react';
import { useState } from 'react';
import { ApiError, type ApiErrorDetail } from '../../api/client.js';
import { formatBytes } from '../../lib/format.js';
import { ctrlEnter } from '../AdminShared/ctrlEnter.js';
import { guessUnit, looksNumeric, parseCsvPreview, type CsvPreview } from './csvPreview.js';
import { useUploadDataset, type DatasetUploadResult } from '../../api/datasets.js';

/** The server's default limit (UPLOAD_MAX_BYTES); the server checks its own configured value. */
export const UPLOAD_HINT_BYTES = 20 * 1024 * 1024;
const PREVIEW_BYTES = 64 * 1024;
/** Characters mathjs unit strings use; anything else cannot be a unit. */
const UNIT_CHARS = /^[A-Za-z0-9^*/ ().\-°µΩ]*$/;

function unitProblem(unit: string): string | null {
  if (!UNIT_CHARS.test(unit)) return 'a unit uses letters, digits and ^ * / ( ) only (for example cm^-3)';
  return null;
}

const baseName = (file: File) => file.name.replace(/\.[^.]*$/, '');

/**
 * Drag-and-drop CSV upload: a preview of the first rows read in the browser, a unit for every
 * column (checked by the server with mathjs on submit), then the upload. Server problems are shown
 * per line and column.
 */
export function DatasetUpload({
  onUploaded,
  onCancel,
}: {
  onUploaded: (r: DatasetUploadResult) => void;
  onCancel?: () => void;
}) {
  const [file, setFile] = useState<File | null>(null);
  const [preview, setPreview] = useState<CsvPreview | null>(null);
  const [units, setUnits] = useState<Record<string, string>>({});
  const [name, setName] = useState('');
  const [visibility, setVisibility] = useState<'private' | 'group'>('private');
  const [readError, setReadError] = useState<string | null>(null);
  const upload = useUploadDataset();

  const choose = async (f: File) => {
    setReadError(null);
    upload.reset();
    try {
      const text = await f.slice(0, PREVIEW_BYTES).text();
      const p = parseCsvPreview(text, 8);
      setFile(f);
      setPreview(p);
      setName(baseName(f));
      setUnits(Object.fromEntries(p.header.map((h) => [h, guessUnit(h)])));
    } catch {
      setReadError('The file could not be read in the browser.');
    }
  };

  const error = upload.error instanceof ApiError ? upload.error : null;
  const rowDetails: ApiErrorDetail[] = error?.details.filter((d) => d.line !== undefined) ?? [];
  const unitError = (col: string) =>
    error?.details.find((d) => d.path === `units.${col}`)?.message ?? (units[col] ? unitProblem(units[col]) : null);
  const localProblems = preview ? preview.header.some((h) => units[h] && unitProblem(units[h])) : false;

  const submit = () => {
    if (!file || localProblems || upload.isPending) return;
    upload.mutate({ file, name: name.trim() || undefined, units, visibility }, { onSuccess: onUploaded });
  };

  return (
    <Stack gap="md" onKeyDown={ctrlEnter(submit)}>
      <Dropzone
        onDrop={(files) => files[0] && void choose(files[0])}
        onReject={(rejections) => setReadError(rejections[0]?.errors[0]?.message ?? 'That file cannot be uploaded')}
        maxSize={UPLOAD_HINT_BYTES}
        maxFiles={1}
        accept={{ 'text/csv': ['.csv'], 'text/plain': ['.csv', '.txt'], 'application/vnd.ms-excel': ['.csv'] }}
        aria-label="CSV file"
        data-testid="dataset-dropzone"
      >
        <Group justify="center" gap="lg" mih={110} style={{ pointerEvents: 'none' }}>
          <Dropzone.Accept>
            <IconUpload size={40} stroke={1.5} />
          </Dropzone.Accept>
          <Dropzone.Reject>
            <IconX size={40} stroke={1.5} />
          </Dropzone.Reject>
          <Dropzone.Idle>
            <IconFileSpreadsheet size={40} stroke={1.5} />
          </Dropzone.Idle>
          <div>
            <Text fw={500}>
              {file ? `${file.name} (${formatBytes(file.size)})` : 'Drop a CSV here, or click to choose one'}
            </Text>
            <Text size="sm" c="dimmed">
              A header row, comma-separated, up to {formatBytes(UPLOAD_HINT_BYTES)} and 200,000 rows. Rows are read in
              full on the server.
            </Text>
          </div>
        </Group>
      </Dropzone>
      {readError ? (
        <Alert color="red" icon={<IconAlertTriangle size={18} />} title="Cannot use this file">
          {readError}
        </Alert>
      ) : null}

      {preview && file ? (
        <Paper withBorder p="md">
          <Stack gap="sm">
            <Group grow align="flex-start">
              <TextInput
                label="Name"
                description="Shown in lists and fits"
                value={name}
                onChange={(e) => setName(e.currentTarget.value)}
                maxLength={200}
                error={error?.detailFor('name')}
              />
              <div>
                <Text size="sm" fw={500}>
                  Visibility
                </Text>
                <Text size="xs" c="dimmed" mb={4}>
                  Group: everyone signed in may read it
                </Text>
                <SegmentedControl
                  value={visibility}
                  onChange={(v) => setVisibility(v as 'private' | 'group')}
                  data={[
                    { value: 'private', label: 'Private' },
                    { value: 'group', label: 'Group' },
                  ]}
                />
              </div>
            </Group>
            <Text size="sm" c="dimmed">
              Give each numeric column its unit as measured (V, cm^-3, eV, K, G, m/s …); values are stored in canonical
              units (SI, temperatures in eV). Leave it empty for a dimensionless number or a text column.
            </Text>
            <ScrollArea>
              <Table striped withTableBorder withColumnBorders fz="sm" data-testid="dataset-preview">
                <Table.Thead>
                  <Table.Tr>
                    {preview.header.map((h, j) => (
                      <Table.Th key={`${h}-${j}`} miw={140} style={{ verticalAlign: 'top' }}>
                        <Stack gap={4}>
                          <Group gap={6} wrap="nowrap">
                            <Text fw={600} size="sm">
                              {h || `(column ${j + 1})`}
                            </Text>
                            <Badge size="xs" variant="light" color={looksNumeric(preview, j) ? 'tide' : 'gray'}>
                              {looksNumeric(preview, j) ? 'number' : 'text'}
                            </Badge>
                          </Group>
                          <TextInput
                            size="xs"
                            aria-label={`Unit of ${h}`}
                            placeholder="unit"
                            value={units[h] ?? ''}
                            onChange={(e) => {
                              const v = e.currentTarget.value;
                              setUnits((u) => ({ ...u, [h]: v }));
                            }}
                            error={unitError(h)}
                            styles={{ input: { fontFamily: 'var(--mantine-font-family-monospace)' } }}
                          />
                        </Stack>
                      </Table.Th>
                    ))}
                  </Table.Tr>
                </Table.Thead>
                <Table.Tbody>
                  {preview.rows.map((r, i) => (
                    <Table.Tr key={i}>
                      {preview.header.map((_, j) => (
                        <Table.Td
                          key={j}
                          style={{
                            fontVariantNumeric: 'tabular-nums',
                            textAlign: looksNumeric(preview, j) ? 'right' : 'left',
                          }}
                        >
                          {r[j] ?? ''}
                        </Table.Td>
                      ))}
                    </Table.Tr>
                  ))}
                </Table.Tbody>
              </Table>
            </ScrollArea>
            <Text size="xs" c="dimmed">
              First {preview.rows.length} rows{preview.truncated ? ' of the file' : ''}.
            </Text>

            {error ? (
              <Alert
                color="red"
                icon={<IconAlertTriangle size={18} />}
                title={error.status === 413 ? 'Too large' : 'The server refused the file'}
                data-testid="upload-error"
              >
                <Text size="sm">{error.message}</Text>
                {rowDetails.length ? (
                  <Table mt="xs" fz="xs" withTableBorder data-testid="upload-error-rows">
                    <Table.Thead>
                      <Table.Tr>
                        <Table.Th>Line</Table.Th>
                        <Table.Th>Column</Table.Th>
                        <Table.Th>Problem</Table.Th>
                      </Table.Tr>
                    </Table.Thead>
                    <Table.Tbody>
                      {rowDetails.map((d, i) => (
                        <Table.Tr key={i}>
                          <Table.Td style={{ fontVariantNumeric: 'tabular-nums' }}>{d.line}</Table.Td>
                          <Table.Td>{d.column ?? '—'}</Table.Td>
                          <Table.Td>{d.message}</Table.Td>
                        </Table.Tr>
                      ))}
                    </Table.Tbody>
                  </Table>
                ) : null}
              </Alert>
            ) : null}

            <Group justify="flex-end">
              {onCancel ? (
                <Button variant="default" onClick={onCancel}>
                  Cancel
                </Button>
              ) : null}
              <Button
                leftSection={<IconUpload size={16} />}
                onClick={submit}
                loading={upload.isPending}
                disabled={localProblems}
                title="Ctrl+Enter"
              >
                Upload dataset
              </Button>
            </Group>
          </Stack>
        </Paper>
      ) : null}
    </Stack>
  );
}
