import { Alert, Badge, Grid, Group, Paper, SegmentedControl, SimpleGrid, Stack, Text, Title } from '@mantine/core';
import { useDebouncedValue } from '@mantine/hooks';
import { IconAlertCircle } from '@tabler/icons-react';
import { useMemo } from 'react';
import {
  checkInputValue,
  densityFromPressure,
  models,
  pressureInPascal,
  type InputSpec,
  type ModelDefinition,
  type PointResult,
  type Profile,
} from '@driftgrid/domain';
import { PageHeader } from '../components/PageHeader/PageHeader.js';
import { QuantityInput } from '../components/QuantityInput/QuantityInput.js';
import { OutputsTable } from '../components/QuantityInput/ModelOutputs.js';
import { ValidityBanner } from '../components/ValidityBanner/ValidityBanner.js';
import { parseInput } from '../components/QuantityInput/parseInput.js';
import { ProfilePlot } from '../components/ProfilePlot/ProfilePlot.js';
import { useDraft } from '../hooks/useDraft.js';

// One shared empty object so an untouched model keeps a stable identity (no debounce churn).
const EMPTY: Record<string, string> = {};

interface SinglePointDraft {
  model: string;
  /** What was typed, per model and input; empty means the registry default. */
  text: Record<string, Record<string, string>>;
}

interface Evaluation {
  errors: Record<string, string>;
  result: PointResult | null;
  profile: Profile | null;
  inputs: Record<string, number>;
}

/** Parses every field and, when all are good, evaluates the point in the browser (no round trip). */
function evaluate(model: ModelDefinition, text: Record<string, string>): Evaluation {
  const errors: Record<string, string> = {};
  const inputs: Record<string, number> = {};
  const pressures: [InputSpec, number][] = [];
  for (const spec of model.inputs) {
    const t = text[spec.name] ?? '';
    if (t.trim() === '') {
      inputs[spec.name] = spec.default;
      continue;
    }
    // A density with `pressureAt` also takes a pressure ("1 Pa"), converted once its temperature is read.
    const pPa = spec.pressureAt ? pressureInPascal(t) : null;
    if (pPa !== null) {
      pressures.push([spec, pPa]);
      continue;
    }
    const p = parseInput(spec, t);
    if (p.ok) inputs[spec.name] = p.value;
    else errors[spec.name] = p.error;
  }
  for (const [spec, pPa] of pressures) {
    const tn = inputs[spec.pressureAt!];
    if (tn === undefined) continue;
    const n = densityFromPressure(pPa, tn);
    const bad = checkInputValue(spec, n);
    if (bad) errors[spec.name] = `${bad} (from ${pPa} Pa at ${spec.pressureAt})`;
    else inputs[spec.name] = n;
  }
  if (Object.keys(errors).length) return { errors, result: null, profile: null, inputs };
  return { errors, result: model.evaluate(inputs), profile: model.profile ? model.profile(inputs) : null, inputs };
}

export default function SinglePointPage() {
  const [draft, setDraft] = useDraft<SinglePointDraft>('single-point', { model: 'cross-field', text: {} });
  const model = models.find((m) => m.id === draft.model) ?? models[0]!;
  const text = draft.text[model.id] ?? EMPTY;
  // Errors follow every keystroke; the (heavier) evaluation and plots follow after a short pause.
  const [debounced] = useDebouncedValue(text, 120);
  const fieldErrors = useMemo(() => evaluate(model, text).errors, [model, text]);
  const ev = useMemo(() => evaluate(model, debounced), [model, debounced]);

  const setText = (name: string, value: string) =>
    setDraft((d) => ({ ...d, text: { ...d.text, [model.id]: { ...(d.text[model.id] ?? {}), [name]: value } } }));

  return (
    <>
      <PageHeader
        title="Single point"
        description="Evaluate a model at one parameter set. Type numbers in the unit shown or values with units (10 eV, 1500 G, 2 cm, 1e13 cm^-3; a neutral density also takes a pressure such as 1 Pa or 7.5 mTorr, converted at T_n); empty fields take the default."
      />
      <Stack gap="md">
        <Group gap="sm" align="center">
          <Text fz="sm" fw={500} id="model-picker-label">
            Model
          </Text>
          <SegmentedControl
            aria-labelledby="model-picker-label"
            data-testid="model-picker"
            value={model.id}
            onChange={(id) => setDraft((d) => ({ ...d, model: id }))}
            data={models.map((m) => ({ value: m.id, label: m.title }))}
          />
          <Badge variant="light" color="gray" ff="monospace">
            {model.id} v{model.version}
          </Badge>
        </Group>
        <Text fz="sm" c="dimmed">
          {model.summary}
        </Text>
        <Grid gutter="lg">
          <Grid.Col span={{ base: 12, md: 5 }}>
            <Paper withBorder p="md" radius="sm">
              <Title order={2} fz="h4" mb="sm">
                Inputs
              </Title>
              <SimpleGrid cols={1} spacing="sm">
                {model.inputs.map((spec) => (
                  <QuantityInput
                    key={spec.name}
                    spec={spec}
                    value={text[spec.name] ?? ''}
                    onChange={(v) => setText(spec.name, v)}
                    error={fieldErrors[spec.name]}
                  />
                ))}
              </SimpleGrid>
            </Paper>
          </Grid.Col>
          <Grid.Col span={{ base: 12, md: 7 }}>
            <Stack gap="md">
              {ev.result ? (
                <>
                  <ValidityBanner model={model} flags={ev.result.flags} values={ev.result.outputs} />
                  <OutputsTable outputs={model.outputs} values={ev.result.outputs} />
                </>
              ) : (
                <Alert
                  color="red"
                  variant="light"
                  icon={<IconAlertCircle size={18} />}
                  title="Fix the highlighted inputs"
                  data-testid="inputs-invalid"
                >
                  The outputs appear as soon as every input is a valid value in its allowed range.
                </Alert>
              )}
            </Stack>
          </Grid.Col>
        </Grid>
        {ev.profile ? (
          <Paper withBorder p="md" radius="sm">
            <Title order={2} fz="h4" mb="sm">
              Radial profiles
            </Title>
            <ProfilePlot profile={ev.profile} a_m={ev.inputs.a_m!} />
          </Paper>
        ) : null}
      </Stack>
    </>
  );
}
