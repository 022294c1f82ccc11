import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useEffect, useId, useMemo, useRef, useState } from 'react';
import { FormProvider, useForm, useWatch, type Resolver } from 'react-hook-form';
import { Link } from 'react-router';
import { Button } from '../../../components/ui/button.tsx';
import { CodeTabs } from '../../../components/ui/code-block.tsx';
import { Alert, ErrorState, LoadingState, PageHeader } from '../../../components/ui/feedback.tsx';
import { Segmented } from '../../../components/ui/segmented.tsx';
import { ApiProblem } from '../../../lib/api-client.ts';
import { maskedKey, organizationKeysQueryOptions, useChosenServerKey } from '../../../lib/organization-keys.ts';
import { useSession } from '../../../lib/session.ts';
import { setUnitSystem, useUnitSystem, type UnitSystem } from '../../../lib/units.ts';
import { clean, type CalcDefinition, type Envelope, type RunRequest } from '../definition.ts';
import { buildSnippets } from '../../../lib/code-snippets.ts';
import { Basis, Cautions, Checks } from './result-envelope.tsx';

const RUN_ROLES = ['owner', 'admin', 'developer'];

/** The request for the form's values as they are now (default: the input as typed, cleaned). */
function requestFor(definition: CalcDefinition, values: Record<string, unknown>): RunRequest {
  if (definition.toRequest) return definition.toRequest(values);
  const input = clean(values.input) as Record<string, unknown>;
  return { body: { input }, snippet: { endpoint: definition.endpoint, body: input } };
}

/** "#/input/pack/0/seriesCells" → "input.pack.0.seriesCells" (RFC 6901 unescaped). */
const pointerToName = (pointer: string) =>
  pointer
    .replace(/^#\/?/, '')
    .split('/')
    .map((p) => p.replaceAll('~1', '/').replaceAll('~0', '~'))
    .join('.');

function KeyPicker({ state, keyError }: { state: ReturnType<typeof useChosenServerKey>; keyError?: string }) {
  const id = useId();
  const { keys, usable, chosen, choose } = state;
  if (keys.isPending) return <LoadingState label="Loading your keys…" />;
  if (keys.isError) return <ErrorState error={keys.error} onRetry={() => void keys.refetch()} />;
  if (usable.length === 0) {
    return (
      <Alert tone="warn" title="No server key yet">
        Playground calls run under one of your organization’s server keys and count like any call.{' '}
        <Link to="/keys" className="font-medium underline">
          Create a server key
        </Link>{' '}
        first.
      </Alert>
    );
  }
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium">
        Run under key
      </label>
      <select
        id={id}
        value={chosen?.id ?? ''}
        onChange={(e) => choose(e.target.value)}
        aria-describedby={`${id}-hint${keyError ? ` ${id}-error` : ''}`}
        aria-invalid={keyError ? true : undefined}
        className="mt-1 block min-w-64 rounded-md border border-line bg-white px-3 py-2 text-sm"
      >
        {usable.map((k) => (
          <option key={k.id} value={k.id}>
            {k.name} · {maskedKey(k)}
          </option>
        ))}
      </select>
      <p id={`${id}-hint`} className="mt-1 text-xs text-graphite-soft">
        Each run is a metered call, counted against this key.
      </p>
      {keyError ? (
        <p id={`${id}-error`} className="mt-1 text-sm font-medium text-danger">
          {keyError}
        </p>
      ) : null}
    </div>
  );
}

export function CalculationPage({ definition }: { definition: CalcDefinition }) {
  const session = useSession();
  const role = session.data?.organization?.role;
  const mayRun = role !== undefined && RUN_ROLES.includes(role);
  const units = useUnitSystem();
  const keyState = useChosenServerKey();
  const { chosen } = keyState;
  const queryClient = useQueryClient();
  const form = useForm<Record<string, unknown>>({
    resolver: zodResolver(definition.formSchema as never) as unknown as Resolver<Record<string, unknown>>,
    defaultValues: definition.defaults,
    mode: 'onSubmit',
    reValidateMode: 'onChange',
  });
  const [ran, setRan] = useState<{ request: RunRequest; result: Envelope } | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const [keyError, setKeyError] = useState<string | undefined>();
  const resultHeading = useRef<HTMLHeadingElement>(null);
  const formRef = useRef<HTMLFormElement>(null);

  const run = useMutation({
    mutationFn: async ({ keyId, request }: { keyId: string; request: RunRequest }) => ({ request, result: await definition.run(keyId, request.body) }),
    onSuccess: (done) => {
      setRan(done);
      void queryClient.invalidateQueries(organizationKeysQueryOptions());
      void queryClient.invalidateQueries({ queryKey: ['overview'] });
    },
    onError: (error) => {
      if (!(error instanceof ApiProblem)) {
        setFormError('Something went wrong. Try again.');
        return;
      }
      let unplaced = false;
      for (const e of error.problem.errors ?? []) {
        if (!e.pointer) {
          unplaced = true;
          continue;
        }
        const name = pointerToName(e.pointer);
        if (name === 'keyId') {
          setKeyError(e.detail);
          continue;
        }
        form.setError(name, { type: 'server', message: e.detail });
        if (!formRef.current?.querySelector(`[name="${CSS.escape(name)}"]`)) unplaced = true;
      }
      setFormError(unplaced || !(error.problem.errors ?? []).length ? `${error.problem.title}: ${error.message}` : null);
    },
  });

  useEffect(() => {
    if (ran) resultHeading.current?.focus();
  }, [ran]);

  const onSubmit = form.handleSubmit(() => {
    setFormError(null);
    setKeyError(undefined);
    if (!chosen) return;
    run.mutate({ keyId: chosen.id, request: requestFor(definition, form.getValues()) });
  });

  const values = useWatch({ control: form.control }) as Record<string, unknown>;
  const snippets = useMemo(
    () => buildSnippets(requestFor(definition, values).snippet, { origin: window.location.origin, key: chosen ? { name: chosen.name, masked: maskedKey(chosen) } : undefined }),
    [definition, values, chosen],
  );

  const { Form, Result } = definition;
  return (
    <div>
      <PageHeader
        title={definition.title}
        summary={
          <>
            {definition.summary} <span className="font-mono text-sm">POST {definition.endpoint}</span>
          </>
        }
      />
      <div className="mb-6 flex flex-wrap items-end gap-6">
        <KeyPicker state={keyState} keyError={keyError} />
        {definition.units ? (
          <Segmented<UnitSystem>
            label="Units"
            value={units}
            onChange={setUnitSystem}
            options={[
              { value: 'imperial', label: 'Imperial (ft, °F)' },
              { value: 'metric', label: 'Metric (m, °C)' },
            ]}
          />
        ) : null}
      </div>
      <div className="grid gap-8 2xl:grid-cols-[minmax(0,34rem)_minmax(0,1fr)]">
        <FormProvider {...form}>
          <form ref={formRef} noValidate onSubmit={(e) => void onSubmit(e)} aria-label={`${definition.title} inputs`} className="space-y-4">
            <Form />
            {formError ? <Alert tone="danger" title="The calculation was not run">{formError}</Alert> : null}
            {!mayRun && role ? (
              <Alert tone="info">Your role ({role}) can read results but not run calls: they count against the organization’s quota.</Alert>
            ) : null}
            <div className="flex flex-wrap gap-3">
              <Button type="submit" busy={run.isPending} disabled={!mayRun || !chosen}>
                Run calculation
              </Button>
              <Button
                tone="secondary"
                onClick={() => {
                  form.reset(definition.defaults);
                  setFormError(null);
                }}
              >
                Reset to the example
              </Button>
            </div>
          </form>
        </FormProvider>
        <section aria-labelledby="result-title" className="min-w-0 space-y-5">
          <h2 id="result-title" ref={resultHeading} tabIndex={-1} className="text-lg font-semibold">
            Result
          </h2>
          <div aria-live="polite" className="sr-only">
            {run.isPending ? 'Running…' : ran ? 'Result ready.' : ''}
          </div>
          {ran ? (
            <>
              <Checks checks={ran.result.checks} />
              <Result result={ran.result} request={ran.request} />
              <Cautions cautions={ran.result.cautions} />
              <Basis basis={ran.result.basis} />
            </>
          ) : (
            <p className="rounded-lg border border-dashed border-line bg-paper-deep px-5 py-6 text-sm text-graphite-soft">
              Run the calculation to see the result here: the figures with their units, the checks, the cautions and how it was worked out.
            </p>
          )}
        </section>
      </div>
      <section aria-labelledby="code-title" className="mt-10">
        <h2 id="code-title" className="text-lg font-semibold">
          Copy as code
        </h2>
        <p className="mb-3 mt-1 text-sm text-graphite-soft">
          The same request to the API, as it stands in the form. Server keys stay secret: the code reads the key from <span className="font-mono">OHMSTEAD_API_KEY</span> on your server.
        </p>
        <CodeTabs label="Request as code" snippets={snippets} />
      </section>
    </div>
  );
}
