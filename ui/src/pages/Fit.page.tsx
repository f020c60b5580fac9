import { Alert, Anchor, Button, Code, Stack, Text } from '@mantine/core';
import { IconArrowLeft } from '@tabler/icons-react';
import { CREATOR_ROLES } from '@driftgrid/domain';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { hasRole, useMe } from '../api/auth.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';
import { useFit } from '../api/fits.js';
import { FitDetail } from '../components/FitsPanel/FitsPanel.js';

/** One saved fit: result, plots, and the request it was run with. */
export default function FitPage() {
  const { id = '' } = useParams();
  const fitId = Number(id);
  const q = useFit(Number.isInteger(fitId) && fitId > 0 ? fitId : null);
  const f = q.data;
  const navigate = useNavigate();
  const { data: me } = useMe();
  // A fit that did not converge can be run again from its last iterate, in the Fits page's form.
  const startAgain =
    f && hasRole(me, CREATOR_ROLES)
      ? () => void navigate(`/fits?sourceKind=${f.source.kind}&sourceId=${f.source.id}&from=${f.id}`)
      : undefined;
  return (
    <>
      <PageHeader
        title={`Fit ${id}`}
        description={
          f ? (
            <>
              On{' '}
              <Anchor
                component={Link}
                to={f.source.kind === 'sweep' ? `/sweeps/${f.source.id}` : `/datasets/${f.source.id}`}
              >
                {f.source.kind} {f.source.id}
                {f.source.name ? ` · ${f.source.name}` : ''}
              </Anchor>
            </>
          ) : (
            'A saved fit'
          )
        }
        actions={
          <Button component={Link} to="/fits" variant="default" leftSection={<IconArrowLeft size={16} />}>
            All fits
          </Button>
        }
      />
      {q.error ? (
        <Alert color="red" variant="light" title="Fit not available">
          {(q.error as Error).message}
        </Alert>
      ) : null}
      {f ? (
        <Stack gap="md">
          <FitDetail
            fit={f}
            onStartFrom={startAgain}
            startFromLabel="Start a new fit from the last iterate (opens the Fits form)"
          />
          <div>
            <Text fz="sm" fw={500} mb={4}>
              Request
            </Text>
            <Code block>{JSON.stringify(f.request, null, 2)}</Code>
          </div>
        </Stack>
      ) : null}
    </>
  );
}
