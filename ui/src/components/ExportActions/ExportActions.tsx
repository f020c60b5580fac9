import { Alert, Button, Group, Modal, Stack, Text } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconArchive, IconDownload, IconLock, IconShieldCheck } from '@tabler/icons-react';
import { useRef, useState } from 'react';
import { COMPLETE_STATES } from '@driftgrid/domain';
import { useMe } from '../../api/auth.js';
import { ApiError } from '../../api/client.js';
import { useDownloadZip, type DownloadedFile } from '../../api/downloads.js';
import { useArchiveSweep, type SweepView } from '../../api/sweeps.js';
import { ArchiveDigest } from './ArchiveDigest.js';
import { formatDateTime } from '../../lib/formatDate.js';

/**
 * Export and archive actions for one sweep (the GET /api/sweeps/:id shape): download the zipped CSV,
 * archive a completed sweep (owner or admin, after a confirmation), and for archived sweeps the
 * SHA-256 and size of the frozen zip.
 */
export function ExportActions({ sweep }: { sweep: SweepView }) {
  const { data: me } = useMe();
  const [confirming, setConfirming] = useState(false);
  // The received file with the archive digest current when it was requested: a zip fetched before
  // archiving is built afresh and differs from the frozen one, so only a download of the frozen
  // archive is compared with its SHA-256.
  const [downloaded, setDownloaded] = useState<{ file: DownloadedFile; frozenSha256: string | null } | null>(null);
  const frozenAtRequest = useRef<string | null>(null);
  const mayManage = !!me && (me.role === 'admin' || Number(me.id) === sweep.owner.id);

  const download = useDownloadZip(`/sweeps/${sweep.id}/export`, `sweep-${sweep.id}.zip`, {
    onSuccess: (file) => setDownloaded({ file, frozenSha256: frozenAtRequest.current }),
  });
  const startDownload = () => {
    frozenAtRequest.current = sweep.archive?.sha256 ?? null;
    download.mutate();
  };
  const archive = useArchiveSweep(sweep.id, {
    onSuccess: () => {
      setConfirming(false);
      notifications.show({
        title: 'Sweep archived',
        message: `${sweep.name} is frozen; its export has a SHA-256.`,
        icon: <IconLock size={16} />,
      });
    },
  });

  const canExport = (COMPLETE_STATES as readonly string[]).includes(sweep.status);
  const matches =
    downloaded?.file.sha256 && downloaded.frozenSha256 ? downloaded.file.sha256 === downloaded.frozenSha256 : null;

  return (
    <Stack gap="sm" data-testid="export-actions">
      <Group gap="sm">
        <Button
          leftSection={<IconDownload size={16} />}
          onClick={startDownload}
          loading={download.isPending}
          disabled={!canExport}
          data-testid="export-download"
        >
          Download zipped CSV
        </Button>
        {mayManage && sweep.status === 'completed' ? (
          <Button
            variant="light"
            leftSection={<IconArchive size={16} />}
            onClick={() => setConfirming(true)}
            data-testid="archive-open"
          >
            Archive…
          </Button>
        ) : null}
      </Group>
      {!canExport ? (
        <Text size="sm" c="dimmed">
          The export is available once the sweep has completed.
        </Text>
      ) : (
        <Text size="sm" c="dimmed">
          results.csv (full precision), columns.csv (name, unit, meaning), manifest.json (definition, versions, SHA-256,
          fits) and README.txt (flags and cautions).
        </Text>
      )}
      {download.error ? (
        <Alert color="red" title="Download failed">
          {download.error instanceof ApiError ? download.error.message : 'The download could not be completed.'}
        </Alert>
      ) : null}

      {sweep.archive ? (
        <Stack gap={4}>
          <Group gap={6}>
            <IconLock size={16} aria-hidden />
            <Text size="sm">
              Archived {sweep.archive.archivedAt ? formatDateTime(sweep.archive.archivedAt) : ''}: the sweep and its
              export are frozen.
            </Text>
          </Group>
          <ArchiveDigest sha256={sweep.archive.sha256} bytes={sweep.archive.bytes} />
        </Stack>
      ) : null}
      {downloaded ? (
        <Text size="sm" c="dimmed" data-testid="download-result">
          Saved {downloaded.file.fileName}.{' '}
          {matches === true ? (
            <span data-testid="download-verified">
              <IconShieldCheck size={14} aria-hidden /> SHA-256 of the received file matches the archive.
            </span>
          ) : matches === false ? (
            <span data-testid="download-mismatch">
              SHA-256 of the received file differs from the archive: download it again.
            </span>
          ) : sweep.archive ? (
            'That file was downloaded before archiving; download again for the frozen archive and its check.'
          ) : null}
        </Text>
      ) : null}

      <Modal opened={confirming} onClose={() => setConfirming(false)} title="Archive this sweep?" centered>
        <Stack gap="sm">
          <Text size="sm">
            Archiving freezes the sweep: its definition, rows and the fits attached so far can no longer be changed or
            deleted. The zipped CSV is built once, stored with its SHA-256, and every later download is that same file.
            Everyone signed in, reviewers included, can then find and download it. This cannot be undone.
          </Text>
          <Text size="sm" c="dimmed">
            Fits made after archiving are kept as usual but are not added to the frozen zip.
          </Text>
          {archive.error ? (
            <Alert color="red" title="Not archived">
              {archive.error instanceof ApiError ? archive.error.message : 'The archive could not be made.'}
            </Alert>
          ) : null}
          <Group justify="flex-end">
            <Button variant="default" onClick={() => setConfirming(false)}>
              Keep it open
            </Button>
            <Button
              leftSection={<IconArchive size={16} />}
              onClick={() => archive.mutate()}
              loading={archive.isPending}
              data-testid="archive-confirm"
            >
              Freeze and archive
            </Button>
          </Group>
        </Stack>
      </Modal>
    </Stack>
  );
}
