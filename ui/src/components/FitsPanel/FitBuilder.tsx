import {
  ActionIcon,
  Alert,
  Button,
  Checkbox,
  Group,
  MultiSelect,
  Paper,
  SegmentedControl,
  Select,
  SimpleGrid,
  Stack,
  Switch,
  Text,
  TextInput,
  Textarea,
} from '@mantine/core';
import { IconMathFunction, IconPlus, IconTrash } from '@tabler/icons-react';
import { useMemo, useState, type KeyboardEvent } from 'react';
import { ApiError } from '../../api/client.js';
import { prettyUnit } from '../../lib/format.js';
import { ExpressionConstants } from '../ExpressionConstants/ExpressionConstants.js';
import type { FitRequestBody, FitSourceKind } from '../FitResult/fit-types.js';
import {
  PROBE_MODELS,
  SINGLE_X,
  initialState,
  parameterNames,
  toRequest,
  type BuilderState,
  type FitModel,
} from './builder-state.js';
import { ProbeFields } from './ProbeFields.js';
import { probeColumns } from './probe-columns.js';
import { SteerParameters } from './SteerParameters.js';

export interface FitColumn {
  name: string;
  unit: string;
  kind: string;
}

const MODELS: { value: FitModel; label: string; hint: string }[] = [
  {
    value: 'power-law',
    label: 'Power law  y = C·∏ xₖ^aₖ',
    hint: 'Parameters C and exp_<column>; start from a log–log least-squares fit. A y of one sign (negative everywhere) is fitted as |y| with the sign on C.',
  },
  {
    value: 'exponential',
    label: 'Exponential  y = A·exp(x/s)',
    hint: 'The Boltzmann form n = n₀·exp(φ/Te): A is in y’s unit and s is the e-folding scale in x’s unit; with x = φ in V, s is Te and is shown as Te in eV.',
  },
  {
    value: 'polytropic',
    label: 'Polytropic  n/n₀ against φ',
    hint: 'n/n₀ = [1 + ((γ−1)/γ)·φ/Te]^(1/(γ−1)); fits γ and Te (eV), γ = 1 is the Boltzmann relation.',
  },
  {
    value: 'probe-retarding',
    label: 'Single probe  I = I_is·(exp((V − V_f)/Te) − 1)',
    hint: 'Electron-retardation region of a Langmuir probe trace (V in volts, I in amperes, electron current positive). Gives I_is, V_f and Te; with the probe area and ion mass also the density n.',
  },
  {
    value: 'probe-double',
    label: 'Double probe  I = I_is·tanh(V/(2Te))',
    hint: 'Symmetric double probe: I_is is the ion saturation current of one tip. Gives I_is and Te; with the area and ion mass also n.',
  },
  {
    value: 'expression',
    label: 'Expression (your own model)',
    hint: 'A mathjs expression over the x columns with named parameters, e.g. A * exp(phi_V / T) with A = 1, T = 4.',
  },
];

/** Columns a fit can use: numbers only (not the flag mask or text). */
export function numericColumns(columns: FitColumn[]): FitColumn[] {
  return columns.filter((c) => c.kind !== 'flags' && c.kind !== 'text' && c.kind !== 'mask');
}

function option(c: FitColumn) {
  const u = c.unit && c.unit !== '1' ? ` (${prettyUnit(c.unit)})` : '';
  return { value: c.name, label: `${c.name}${u}` };
}

/**
 * The fit form: y, x, model, start values, filter (valid points only for sweeps, ranges), weights.
 * Errors appear beside their fields, from the form's own checks or the server's details; Ctrl+Enter runs.
 */
export function FitBuilder({
  source,
  columns,
  pending,
  error,
  onSubmit,
  initial,
}: {
  source: { kind: FitSourceKind; id: number };
  columns: FitColumn[];
  pending: boolean;
  error: unknown;
  onSubmit: (body: FitRequestBody) => void;
  /** A filled form (e.g. "start again from the last iterate"); the builder is re-keyed to apply it. */
  initial?: BuilderState;
}) {
  const numeric = useMemo(() => numericColumns(columns), [columns]);
  const hasValid = source.kind === 'sweep' && numeric.some((c) => c.name === 'valid');
  const [s, setS] = useState<BuilderState>(() => initial ?? initialState(hasValid));
  const probeTrace = useMemo(() => probeColumns(numeric), [numeric]);
  const [local, setLocal] = useState<Record<string, string>>({});
  const update = (patch: Partial<BuilderState>) => {
    setS((prev) => ({ ...prev, ...patch }));
    setLocal({});
  };
  const options = numeric.filter((c) => c.name !== 'valid' && c.kind !== 'index').map(option);
  const apiErr = error instanceof ApiError ? error : null;
  const serverFor = (prefix: string) =>
    apiErr?.details
      .filter((d) => d.path === prefix || d.path?.startsWith(`${prefix}.`))
      .map((d) => d.message)
      .join('; ') || undefined;
  const fieldError = (key: string) => local[key] ?? serverFor(key);
  const single = SINGLE_X.has(s.model);
  const hint = MODELS.find((m) => m.value === s.model)!.hint;

  const submit = () => {
    const r = toRequest(s, source, hasValid);
    if (!r.ok) {
      setLocal(r.errors);
      return;
    }
    setLocal({});
    onSubmit(r.body);
  };
  const onKeyDown = (e: KeyboardEvent) => {
    if ((e.ctrlKey || e.metaKey) && e.key === 'Enter') {
      e.preventDefault();
      submit();
    }
  };

  return (
    <Paper
      withBorder
      p="md"
      radius="sm"
      component="form"
      noValidate
      aria-label="Fit builder"
      data-testid="fit-builder"
      onSubmit={(e) => {
        e.preventDefault();
        submit();
      }}
      onKeyDown={onKeyDown}
    >
      <Stack gap="sm">
        {probeTrace && !PROBE_MODELS.has(s.model) ? (
          <Alert color="tide" variant="light" title="This looks like a probe trace" data-testid="fit-probe-offer">
            <Group justify="space-between" gap="xs">
              <Text fz="sm">
                Columns {probeTrace.v} and {probeTrace.i} look like a current–voltage characteristic: fit Te, V_f and
                the density with a probe model.
              </Text>
              <Group gap="xs">
                <Button
                  size="compact-sm"
                  variant="light"
                  data-testid="fit-probe-use-single"
                  onClick={() => update({ model: 'probe-retarding', x: [probeTrace.v], y: probeTrace.i })}
                >
                  Single probe
                </Button>
                <Button
                  size="compact-sm"
                  variant="subtle"
                  onClick={() => update({ model: 'probe-double', x: [probeTrace.v], y: probeTrace.i })}
                >
                  Double probe
                </Button>
              </Group>
            </Group>
          </Alert>
        ) : null}
        <Select
          label="Model"
          data-testid="fit-model"
          allowDeselect={false}
          value={s.model}
          data={MODELS.map((m) => ({ value: m.value, label: m.label }))}
          onChange={(v) =>
            update({
              model: (v ?? 'power-law') as FitModel,
              x: SINGLE_X.has((v ?? '') as FitModel) ? s.x.slice(0, 1) : s.x,
            })
          }
          description={hint}
        />
        <SimpleGrid cols={{ base: 1, sm: 2 }} spacing="sm">
          <Select
            label="y (the column to fit)"
            data-testid="fit-y"
            searchable
            placeholder="Choose a column"
            data={options}
            value={s.y}
            onChange={(v) => update({ y: v })}
            error={fieldError('y')}
          />
          {single ? (
            <Select
              label="x"
              data-testid="fit-x"
              searchable
              placeholder="Choose a column"
              data={options.filter((o) => o.value !== s.y)}
              value={s.x[0] ?? null}
              onChange={(v) => update({ x: v ? [v] : [] })}
              error={fieldError('x')}
            />
          ) : (
            <MultiSelect
              label="x (one or more inputs)"
              data-testid="fit-x"
              searchable
              placeholder="Choose columns"
              data={options.filter((o) => o.value !== s.y)}
              value={s.x}
              onChange={(v) => update({ x: v })}
              error={fieldError('x')}
            />
          )}
        </SimpleGrid>
        {s.model === 'expression' ? (
          <TextInput
            label="Expression"
            data-testid="fit-expr"
            placeholder="A * exp(phi_V / T)"
            value={s.expr}
            description="mathjs syntax over the x columns; every other name is a parameter."
            ff="monospace"
            onChange={(e) => update({ expr: e.currentTarget.value })}
            error={fieldError('expr')}
          />
        ) : null}
        {s.model === 'expression' ? <ExpressionConstants /> : null}
        <Textarea
          label={s.model === 'expression' ? 'Start values' : 'Start values (optional)'}
          data-testid="fit-params"
          autosize
          minRows={1}
          maxRows={4}
          placeholder={
            s.model === 'expression'
              ? 'A = 1, T = 4'
              : s.model === 'polytropic'
                ? 'gamma = 1.2, Te_eV = 3'
                : 'leave empty for the model’s own start'
          }
          description="name = value, separated by commas or new lines"
          value={s.params}
          onChange={(e) => update({ params: e.currentTarget.value })}
          error={fieldError('params')}
        />
        {s.model === 'polytropic' ? (
          <Switch
            label="y is already normalised (n/n₀): do not fit n₀"
            data-testid="fit-normalised"
            checked={s.normalised}
            onChange={(e) => update({ normalised: e.currentTarget.checked })}
          />
        ) : null}
        {PROBE_MODELS.has(s.model) ? (
          <ProbeFields
            model={s.model}
            probe={s.probe}
            onChange={(patch) => update({ probe: { ...s.probe, ...patch } })}
            errorFor={fieldError}
          />
        ) : null}
        <div>
          <Text fz="sm" fw={500} mb={4}>
            Hold or bound parameters (optional)
          </Text>
          <SteerParameters
            names={parameterNames(s)}
            steer={s.steer}
            onChange={(name, row) => update({ steer: { ...s.steer, [name]: row } })}
            errorFor={fieldError}
          />
        </div>
        <div>
          <Text fz="sm" fw={500} mb={4}>
            Filter
          </Text>
          <Stack gap={6}>
            {hasValid ? (
              <Checkbox
                label="Valid points only (drift ordering holds: no validity flag raised)"
                data-testid="fit-valid-only"
                checked={s.validOnly}
                onChange={(e) => update({ validOnly: e.currentTarget.checked })}
              />
            ) : null}
            {s.ranges.map((r, i) => (
              <Group key={i} gap="xs" align="flex-start" wrap="nowrap" data-testid={`fit-range-${i}`}>
                <Select
                  aria-label={`Range ${i + 1} column`}
                  placeholder="Column"
                  data={options}
                  value={r.column}
                  w={200}
                  searchable
                  onChange={(v) => update({ ranges: s.ranges.map((x, k) => (k === i ? { ...x, column: v } : x)) })}
                  error={fieldError(`ranges.${i}`) ?? (r.column ? serverFor(`filter.${r.column}`) : undefined)}
                />
                <TextInput
                  aria-label={`Range ${i + 1} minimum`}
                  placeholder="min"
                  w={110}
                  value={r.min}
                  onChange={(e) => {
                    const v = e.currentTarget.value;
                    update({ ranges: s.ranges.map((x, k) => (k === i ? { ...x, min: v } : x)) });
                  }}
                />
                <TextInput
                  aria-label={`Range ${i + 1} maximum`}
                  placeholder="max"
                  w={110}
                  value={r.max}
                  onChange={(e) => {
                    const v = e.currentTarget.value;
                    update({ ranges: s.ranges.map((x, k) => (k === i ? { ...x, max: v } : x)) });
                  }}
                />
                <ActionIcon
                  variant="subtle"
                  color="gray"
                  aria-label={`Remove range ${i + 1}`}
                  mt={6}
                  onClick={() => update({ ranges: s.ranges.filter((_, k) => k !== i) })}
                >
                  <IconTrash size={16} />
                </ActionIcon>
              </Group>
            ))}
            <Group gap="xs">
              <Button
                size="compact-sm"
                variant="subtle"
                leftSection={<IconPlus size={14} />}
                onClick={() => update({ ranges: [...s.ranges, { column: null, min: '', max: '' }] })}
              >
                Add a range
              </Button>
              <Text fz="xs" c="dimmed">
                Ranges are in the column’s stored unit (SI, temperatures in eV).
              </Text>
            </Group>
          </Stack>
        </div>
        <Select
          label="Weights: σ column (optional)"
          data-testid="fit-weights"
          clearable
          placeholder="Unweighted"
          data={options}
          value={s.weights}
          description="One standard deviation per point; turns on weighted least squares, χ² and its p-value."
          onChange={(v) => update({ weights: v })}
          error={fieldError('weights')}
        />
        {s.weights ? (
          <div>
            <Text fz="sm" fw={500} mb={4}>
              σ are
            </Text>
            <SegmentedControl
              data-testid="fit-sigma-mode"
              value={s.sigmaMode}
              onChange={(v) => update({ sigmaMode: v === 'absolute' ? 'absolute' : 'relative' })}
              data={[
                { value: 'relative', label: 'Relative: scale errors by the reduced χ² (default)' },
                { value: 'absolute', label: 'Absolute: the true measurement errors' },
              ]}
            />
          </div>
        ) : null}
        {apiErr && !Object.keys(local).length ? (
          <Alert color="red" variant="light" title="The fit was not run" data-testid="fit-error">
            {apiErr.message}
          </Alert>
        ) : error && !apiErr ? (
          <Alert color="red" variant="light" title="The fit was not run">
            {(error as Error).message}
          </Alert>
        ) : null}
        <Group justify="space-between">
          <Text fz="xs" c="dimmed">
            Ctrl+Enter runs the fit. Rows with a missing value are dropped and counted.
          </Text>
          <Button type="submit" loading={pending} leftSection={<IconMathFunction size={16} />} data-testid="fit-run">
            Run fit
          </Button>
        </Group>
      </Stack>
    </Paper>
  );
}
