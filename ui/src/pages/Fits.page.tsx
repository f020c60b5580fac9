import { Button } from '@mantine/core';
import { IconMathFunction } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

export default function FitsPage() {
  return (
    <>
      <PageHeader title="Fits" description="Reduced models fitted to sweep results or datasets, with standard errors." />
      <EmptyState
        icon={IconMathFunction}
        title="No fits saved yet"
        actions={
          <>
            <Button component={Link} to="/catalogue" variant="light">
              Pick a sweep to fit
            </Button>
            <Button component={Link} to="/datasets" variant="default">
              Upload measurements
            </Button>
          </>
        }
      >
        You will fit a power law, an exponential (Boltzmann) form, the polytropic relation or your own expression to a
        sweep's points or an uploaded dataset, and read each parameter with its standard error, R², RMSE and a
        residual plot. Saved fits are listed here with their source.
      </EmptyState>
    </>
  );
}
