import { Alert, Button, Text } from '@mantine/core';
import { IconArrowLeft } from '@tabler/icons-react';
import { Link, useSearchParams } from 'react-router-dom';
import { useFits, type FitView } from '../api/fits.js';
import { FitCompare } from '../components/FitCompare/FitCompare.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

/** /fits/compare?ids=3,4: two or more saved fits side by side. */
export default function FitComparePage() {
  const [params] = useSearchParams();
  const ids = [
    ...new Set(
      (params.get('ids') ?? '')
        .split(',')
        .map(Number)
        .filter((n) => Number.isInteger(n) && n > 0),
    ),
  ].slice(0, 6);
  const qs = useFits(ids);
  const fits = qs.map((q) => q.data).filter((f): f is FitView => f !== undefined);
  const failed = qs.find((q) => q.error)?.error;
  return (
    <>
      <PageHeader
        title="Compare fits"
        description="Parameters, goodness of fit, AIC/BIC and residuals of fits of the same data, side by side."
        actions={
          <Button component={Link} to="/fits" variant="default" leftSection={<IconArrowLeft size={16} />}>
            All fits
          </Button>
        }
      />
      {ids.length < 2 ? (
        <Alert color="orange" variant="light" title="Choose at least two fits">
          Tick two or more fits in a list of saved fits and press “Compare”.
        </Alert>
      ) : failed ? (
        <Alert color="red" variant="light" title="A fit is not available">
          {(failed as Error).message}
        </Alert>
      ) : fits.length < ids.length ? (
        <Text fz="sm" c="dimmed">
          Loading the fits…
        </Text>
      ) : (
        <FitCompare fits={fits} />
      )}
    </>
  );
}
