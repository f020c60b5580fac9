import {
  ActionIcon,
  Alert,
  Box,
  Button,
  FileButton,
  Grid,
  Group,
  Menu,
  Paper,
  SegmentedControl,
  SimpleGrid,
  Stack,
  TagsInput,
  Text,
  Textarea,
  TextInput,
  Title,
  Tooltip,
} from '@mantine/core';
import { useDebouncedValue } from '@mantine/hooks';
import {
  IconDownload,
  IconFileImport,
  IconPlayerPlay,
  IconPlus,
  IconRestore,
  IconTemplate,
  IconTrash,
} from '@tabler/icons-react';
import { saveText } from '../../lib/download.js';
import { useMemo, useState, type KeyboardEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { checkSweep, models, type PointEvaluation } from '@driftgrid/domain';
import { ApiError } from '../../api/client.js';
import { useSubmitSweep, useSweepPreview } from '../../api/sweeps.js';
import { useDraft } from '../../hooks/useDraft.js';
import {
  axisNames,
  choiceOf,
  errorsByField,
  fieldGroupOf,
  fieldKeyOf,
  fromDefinition,
  initialState,
  modelOf,
  shownErrors,
  toDefinition,
  type BuilderState,
  type InputChoice,
  type SamplingKind,
} from './builderState.js';
import { ExpressionConstants } from '../ExpressionConstants/ExpressionConstants.js';
import { exampleDefinitions } from './examples.js';
import { InputRow } from './InputRow.js';
import { PreviewPanel } from './PreviewPanel.js';
import { PreviewSummary } from './PreviewSummary.js';
import classes from './SweepBuilder.module.css';
import { saltelliExplained } from './saltelli-explained.js';

function slug(name: string): string {
  return (
    name
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '') || 'sweep'
  );
}

/**
 * The sweep builder (SPEC §4, §12): model, inputs as default / fixed / axis, sampling, derived
 * columns, tags, name and visibility; validated as you type with domain's checkSweep, previewed in
 * the browser and by the server, submitted with the button or Ctrl+Enter. The whole form is a
 * draft in localStorage (useDraft), so a re-sign-in loses nothing.
 *
 * Test hooks: `sweep-name`, `builder-model`, `sampling-kind`, `sampling-samples`, `sampling-seed`,
 * `add-derived`, `derived-name-<i>`, `derived-expr-<i>`, `sweep-tags`, `sweep-visibility`,
 * `submit-sweep`, `export-json`, `import-json`, `load-example`, `example-<file>`, `reset-builder`,
 * `submit-error`; per input see InputRow; the preview see PreviewPanel.
 */
export function SweepBuilder() {
  const navigate = useNavigate();
  const [state, setState, draft] = useDraft<BuilderState>('sweep-builder', initialState());
  const [importError, setImportError] = useState<string | null>(null);
  // Parts of the form edited so far; their errors show at once. Everything shows after a submit
  // attempt, an import or a restored draft.
  const [edited, setEdited] = useState<ReadonlySet<string>>(() => new Set());
  const [showAll, setShowAll] = useState(draft.restored);
  const touch = (group: string) => setEdited((prev) => (prev.has(group) ? prev : new Set(prev).add(group)));
  const model = modelOf(state) ?? models[0]!;
  const definition = useMemo(() => toDefinition(state), [state]);

  // Local validation on a short debounce: errors beside the fields while typing.
  const [defForCheck] = useDebouncedValue(definition, 120);
  const local = useMemo(() => {
    const res = checkSweep(defForCheck);
    if (!res.ok)
      return {
        compiled: null,
        errors: res.errors,
        sample: null as PointEvaluation | null,
        sampleError: null as string | null,
      };
    let sample: PointEvaluation | null = null;
    let sampleError: string | null = null;
    try {
      sample = res.compiled.totalPoints > 0 ? res.compiled.evaluatePointAt(0) : null;
    } catch (err) {
      sampleError = (err as Error).message;
    }
    return { compiled: res.compiled, errors: [], sample, sampleError };
  }, [defForCheck]);
  const localFieldErrors = useMemo(() => errorsByField(local.errors, state), [local.errors, state]);

  // The server's verdict (estimate, quota) on a longer debounce, only for definitions that pass locally.
  const [defForServer] = useDebouncedValue(definition, 450);
  const serverEnabled = local.compiled !== null && defForServer === defForCheck;
  const preview = useSweepPreview(defForServer, serverEnabled);

  const submit = useSubmitSweep({
    onSuccess: (res) => {
      draft.clear();
      void navigate(`/sweeps/${res.id}`);
    },
  });
  const submitError = submit.error instanceof ApiError ? submit.error : null;
  const serverFieldErrors = useMemo(
    () =>
      submitError
        ? errorsByField(
            submitError.details.map((d) => ({ path: d.path, message: d.message })),
            state,
          )
        : {},
    [submitError, state],
  );
  const fieldErrors = shownErrors({ ...serverFieldErrors, ...localFieldErrors }, edited, showAll);
  // The same problems, listed in the preview with their labels.
  const listedErrors = local.errors.filter((e) => showAll || edited.has(fieldGroupOf(fieldKeyOf(e.path, state))));
  const quotaRefused = preview.data?.quota && !preview.data.quota.allowed;
  const canSubmit = !submit.isPending && !quotaRefused;

  const onSubmit = () => {
    if (!canSubmit) return;
    // Submit exactly what is on screen now, not the debounced copy; problems not shown yet appear.
    const res = checkSweep(definition);
    if (!res.ok) {
      setShowAll(true);
      return;
    }
    submit.mutate(definition);
  };
  const onKeyDown = (e: KeyboardEvent) => {
    if ((e.ctrlKey || e.metaKey) && e.key === 'Enter') {
      e.preventDefault();
      onSubmit();
    }
  };

  const update = (patch: Partial<BuilderState>) => {
    for (const k of Object.keys(patch)) touch(k);
    setState((s) => ({ ...s, ...patch }));
  };
  const setChoice = (name: string, next: InputChoice) => {
    touch(`input.${name}`);
    touch('axes');
    setState((s) => {
      const prev = s.inputs[s.model]?.[name];
      const order = (s.axisOrder[s.model] ?? []).filter((n) => n !== name);
      // Becoming an axis appends it to the axes list; leaving axis mode drops it.
      const axisOrder =
        next.mode === 'axis' ? (prev?.mode === 'axis' ? (s.axisOrder[s.model] ?? [name]) : [...order, name]) : order;
      return {
        ...s,
        inputs: { ...s.inputs, [s.model]: { ...(s.inputs[s.model] ?? {}), [name]: next } },
        axisOrder: { ...s.axisOrder, [s.model]: axisOrder },
      };
    });
  };
  const setDerived = (i: number, patch: Partial<{ name: string; expr: string }>) => {
    touch(`derived.${i}`);
    setState((s) => ({ ...s, derived: s.derived.map((x, k) => (k === i ? { ...x, ...patch } : x)) }));
  };
  const load = (raw: unknown) => {
    try {
      setState(fromDefinition(raw));
      setShowAll(true);
      setImportError(null);
      submit.reset();
    } catch (err) {
      setImportError((err as Error).message);
    }
  };
  const onImport = async (file: File | null) => {
    if (!file) return;
    try {
      load(JSON.parse(await file.text()));
    } catch (err) {
      setImportError(`${file.name} is not valid JSON: ${(err as Error).message}`);
    }
  };

  const axes = axisNames(state, model);
  const s = state.sampling;

  return (
    <form
      onSubmit={(e) => {
        e.preventDefault();
        onSubmit();
      }}
      onKeyDown={onKeyDown}
      data-testid="sweep-builder"
      noValidate
    >
      <Group justify="space-between" mb="sm" wrap="wrap">
        <Group gap="xs">
          <Menu position="bottom-start" withinPortal>
            <Menu.Target>
              <Button variant="light" size="xs" leftSection={<IconTemplate size={16} />} data-testid="load-example">
                Load example
              </Button>
            </Menu.Target>
            <Menu.Dropdown>
              {exampleDefinitions.map((ex) => (
                <Menu.Item key={ex.file} onClick={() => load(ex.definition)} data-testid={`example-${ex.file}`}>
                  <Text fz="sm">{ex.name}</Text>
                  <Text fz="xs" c="dimmed" ff="monospace">
                    {ex.model} · {ex.file}
                  </Text>
                </Menu.Item>
              ))}
            </Menu.Dropdown>
          </Menu>
          <FileButton onChange={(f) => void onImport(f)} accept="application/json,.json">
            {(props) => (
              <Button
                {...props}
                variant="default"
                size="xs"
                leftSection={<IconFileImport size={16} />}
                data-testid="import-json"
              >
                Import JSON
              </Button>
            )}
          </FileButton>
          <Button
            variant="default"
            size="xs"
            leftSection={<IconDownload size={16} />}
            data-testid="export-json"
            onClick={() =>
              saveText(JSON.stringify(definition, null, 2) + '\n', `${slug(state.name)}.json`, 'application/json')
            }
          >
            Export JSON
          </Button>
          <Button
            variant="subtle"
            size="xs"
            color="gray"
            leftSection={<IconRestore size={16} />}
            data-testid="reset-builder"
            onClick={() => {
              draft.clear();
              submit.reset();
              setEdited(new Set());
              setShowAll(false);
            }}
          >
            Start over
          </Button>
        </Group>
        {draft.restored ? (
          <Text fz="xs" c="dimmed" data-testid="draft-restored">
            Your unsaved draft was restored.
          </Text>
        ) : null}
      </Group>
      {importError ? (
        <Alert
          color="red"
          variant="light"
          mb="sm"
          title="Could not load the definition"
          withCloseButton
          onClose={() => setImportError(null)}
        >
          {importError}
        </Alert>
      ) : null}

      <Grid gutter="lg">
        <Grid.Col span={{ base: 12, lg: 7 }}>
          <Box hiddenFrom="lg" mb="md" className={classes.summary}>
            <PreviewSummary
              points={local.compiled?.totalPoints ?? null}
              problems={listedErrors.length}
              server={local.compiled ? preview.data : undefined}
              serverLoading={preview.isFetching || (local.compiled !== null && !serverEnabled)}
              sampleFlags={local.sample ? local.sample.flags.length : null}
            />
          </Box>
          <Stack gap="md">
            <Paper withBorder p="md" radius="sm">
              <Stack gap="sm">
                <TextInput
                  label="Name"
                  required
                  data-testid="sweep-name"
                  aria-label="Sweep name"
                  placeholder="Argon column: Te × B scan"
                  value={state.name}
                  onChange={(e) => update({ name: e.currentTarget.value })}
                  error={fieldErrors.name}
                  description="Shown in the catalogue; up to 200 characters."
                />
                <div>
                  <Text fz="sm" fw={500} mb={4} id="builder-model-label">
                    Model
                  </Text>
                  <SegmentedControl
                    aria-labelledby="builder-model-label"
                    data-testid="builder-model"
                    value={state.model}
                    onChange={(v) => update({ model: v })}
                    data={models.map((m) => ({ value: m.id, label: m.title }))}
                  />
                  <Text fz="xs" c="dimmed" mt={4}>
                    {model.summary}
                  </Text>
                  {fieldErrors.model ? (
                    <Text fz="xs" c="red">
                      {fieldErrors.model}
                    </Text>
                  ) : null}
                </div>
                <Textarea
                  label="Description"
                  autosize
                  minRows={1}
                  maxRows={4}
                  value={state.description}
                  onChange={(e) => update({ description: e.currentTarget.value })}
                  error={fieldErrors.description}
                />
              </Stack>
            </Paper>

            <div>
              <Title order={2} fz="h4" mb={4}>
                Inputs
              </Title>
              <Text fz="xs" c="dimmed" mb="xs">
                Each input keeps its default, takes a fixed value (a number in the unit shown, a value with units such
                as "2 cm", or an expression over other inputs such as "Te_eV"), or becomes an axis.
              </Text>
              {fieldErrors.axes ? (
                <Text fz="xs" c="red" mb="xs" role="alert">
                  {fieldErrors.axes}
                </Text>
              ) : null}
              <Stack gap="xs">
                {model.inputs.map((spec) => (
                  <InputRow
                    key={`${model.id}-${spec.name}`}
                    spec={spec}
                    choice={choiceOf(state, spec)}
                    onChange={(c) => setChoice(spec.name, c)}
                    errors={fieldErrors}
                    axisIndex={axes.includes(spec.name) ? axes.indexOf(spec.name) : null}
                  />
                ))}
              </Stack>
            </div>

            <Paper withBorder p="md" radius="sm">
              <Title order={2} fz="h4" mb="xs">
                Sampling
              </Title>
              <SegmentedControl
                data-testid="sampling-kind"
                aria-label="Sampling design"
                value={s.kind}
                onChange={(v) => update({ sampling: { ...s, kind: v as SamplingKind } })}
                data={[
                  { value: 'grid', label: 'Grid (every combination)' },
                  { value: 'latin-hypercube', label: 'Latin hypercube' },
                  { value: 'sobol', label: 'Sobol sequence' },
                  { value: 'saltelli', label: 'Sensitivity (Saltelli)' },
                ]}
              />
              <Text fz="xs" c="dimmed" mt={4} data-testid="sampling-explained">
                {s.kind === 'grid'
                  ? 'The Cartesian product of the axes: linear and log axes need a point count.'
                  : s.kind === 'saltelli'
                    ? saltelliExplained(s.samples, axes.length)
                    : 'Random designs sample each axis between its ends (log axes in log space); point counts on axes are ignored.'}
              </Text>
              {s.kind !== 'grid' ? (
                <SimpleGrid cols={2} mt="xs" spacing="xs">
                  <TextInput
                    size="xs"
                    label={s.kind === 'saltelli' ? 'Sample groups (N)' : 'Samples'}
                    data-testid="sampling-samples"
                    aria-label="Samples"
                    value={s.samples}
                    onChange={(e) => update({ sampling: { ...s, samples: e.currentTarget.value } })}
                    error={fieldErrors['sampling.samples']}
                    inputMode="numeric"
                  />
                  {s.kind === 'latin-hypercube' ? (
                    <TextInput
                      size="xs"
                      label="Seed (reproducible)"
                      data-testid="sampling-seed"
                      aria-label="Seed"
                      value={s.seed}
                      onChange={(e) => update({ sampling: { ...s, seed: e.currentTarget.value } })}
                      error={fieldErrors['sampling.seed']}
                      inputMode="numeric"
                    />
                  ) : null}
                </SimpleGrid>
              ) : null}
              {fieldErrors.sampling ? (
                <Text fz="xs" c="red">
                  {fieldErrors.sampling}
                </Text>
              ) : null}
            </Paper>

            <Paper withBorder p="md" radius="sm">
              <Group justify="space-between" mb="xs">
                <Title order={2} fz="h4">
                  Derived columns
                </Title>
                <Button
                  size="xs"
                  variant="light"
                  leftSection={<IconPlus size={14} />}
                  data-testid="add-derived"
                  onClick={() => update({ derived: [...state.derived, { name: '', expr: '' }] })}
                >
                  Add column
                </Button>
              </Group>
              <Text fz="xs" c="dimmed" mb="xs">
                A named column per point from a mathjs expression over inputs and outputs, e.g. vE_ms / vDi_ms.
              </Text>
              <ExpressionConstants />
              <Stack gap="xs">
                {state.derived.map((d, i) => (
                  <Group key={i} align="flex-start" gap="xs" wrap="nowrap">
                    <TextInput
                      size="xs"
                      w={180}
                      label={i === 0 ? 'Name' : undefined}
                      aria-label={`Derived column ${i + 1} name`}
                      data-testid={`derived-name-${i}`}
                      value={d.name}
                      onChange={(e) => setDerived(i, { name: e.currentTarget.value })}
                      error={fieldErrors[`derived.${i}.name`]}
                    />
                    <TextInput
                      size="xs"
                      style={{ flex: 1 }}
                      label={i === 0 ? 'Expression' : undefined}
                      aria-label={`Derived column ${i + 1} expression`}
                      data-testid={`derived-expr-${i}`}
                      value={d.expr}
                      onChange={(e) => setDerived(i, { expr: e.currentTarget.value })}
                      error={fieldErrors[`derived.${i}.expr`] ?? fieldErrors[`derived.${i}`]}
                      spellCheck={false}
                    />
                    <Tooltip label="Remove this column">
                      <ActionIcon
                        variant="subtle"
                        color="gray"
                        mt={i === 0 ? 22 : 2}
                        aria-label={`Remove derived column ${i + 1}`}
                        onClick={() => update({ derived: state.derived.filter((_, k) => k !== i) })}
                      >
                        <IconTrash size={16} />
                      </ActionIcon>
                    </Tooltip>
                  </Group>
                ))}
              </Stack>
            </Paper>

            <Paper withBorder p="md" radius="sm">
              <SimpleGrid cols={{ base: 1, sm: 2 }} spacing="sm">
                <TagsInput
                  label="Tags"
                  data-testid="sweep-tags"
                  aria-label="Tags"
                  description="Lower-case words for the catalogue filters; Enter adds one."
                  value={state.tags}
                  onChange={(tags) => update({ tags })}
                  error={
                    Object.entries(fieldErrors)
                      .filter(([k]) => k.startsWith('tags'))
                      .map(([, v]) => v)
                      .join('; ') || undefined
                  }
                />
                <div>
                  <Text fz="sm" fw={500} mb={4} id="visibility-label">
                    Visibility
                  </Text>
                  <SegmentedControl
                    aria-labelledby="visibility-label"
                    data-testid="sweep-visibility"
                    value={state.visibility}
                    onChange={(v) => update({ visibility: v as 'private' | 'group' })}
                    data={[
                      { value: 'private', label: 'Private' },
                      { value: 'group', label: 'Group' },
                    ]}
                  />
                  <Text fz="xs" c="dimmed" mt={4}>
                    {state.visibility === 'private'
                      ? 'Only you, people you share it with, and admins.'
                      : 'Everyone signed in can read it.'}
                  </Text>
                </div>
              </SimpleGrid>
            </Paper>
          </Stack>
        </Grid.Col>
        <Grid.Col span={{ base: 12, lg: 5 }}>
          <div className={classes.side} data-testid="preview-side">
            <div className={classes.sideScroll}>
              <PreviewPanel
                compiled={local.compiled}
                sample={local.sample}
                sampleError={local.sampleError}
                localErrors={listedErrors}
                server={local.compiled ? preview.data : undefined}
                serverLoading={preview.isFetching || (local.compiled !== null && !serverEnabled)}
                serverError={preview.error instanceof Error ? preview.error.message : null}
              />
            </div>
            {submitError ? (
              <Alert
                color="red"
                variant="light"
                title={submitError.status === 429 ? 'Refused by your quota' : 'The server did not accept the sweep'}
                data-testid="submit-error"
              >
                {submitError.message}
              </Alert>
            ) : null}
            <Button
              type="submit"
              size="md"
              leftSection={<IconPlayerPlay size={18} />}
              disabled={!canSubmit}
              loading={submit.isPending}
              data-testid="submit-sweep"
            >
              Submit sweep
            </Button>
            <Text fz="xs" c="dimmed" ta="center">
              Ctrl+Enter submits from any field. Your input is kept as a draft until you submit.
            </Text>
          </div>
        </Grid.Col>
      </Grid>
    </form>
  );
}
