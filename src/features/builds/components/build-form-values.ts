// The build form's values and their checks: the shared build schema with the project's factor
// bounds and levels on top, the values an existing build opens with, and the clean-up before
// sending. Kept apart from the component so each step can be tested alone.
import type { Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import type { Build, FactorDef } from '@shared/api-types';
import { buildCreateSchema, checkFactorValues, type BuildCreate } from '@shared/schemas/build';

export type BuildFormValues = z.input<typeof buildCreateSchema>;

/** An input's text as a number: blank (or not a number at all) is "no value". */
export const asNumber = (v: unknown) => (v === '' || v == null || (typeof v === 'number' && Number.isNaN(v)) ? undefined : Number(v));
/** A select's value as an id: blank is "none". */
export const asId = (v: unknown) => (v === '' || v == null ? null : Number(v));
/** Blank text is "not given". */
export const blankAsUndefined = (v: unknown) => (v === '' ? undefined : v);
export const blankAsNull = (v: unknown) => (v === '' ? null : v);

const isEmpty = (x: unknown) => x === undefined || x === '' || x === null || (typeof x === 'number' && Number.isNaN(x));

/** Drop the empty inputs inside the nested records (factors, responses, test conditions) before validating. */
function dropEmpty(input: unknown): unknown {
  if (!input || typeof input !== 'object') return input;
  const v = { ...(input as Record<string, unknown>) };
  for (const key of ['factors', 'responses', 'testConditions']) {
    const rec = v[key] as Record<string, unknown> | undefined;
    if (rec && typeof rec === 'object') v[key] = Object.fromEntries(Object.entries(rec).filter(([, x]) => !isEmpty(x)));
  }
  return v;
}

/**
 * The schema the form checks: the server's build schema, plus each factor value against the
 * project's bounds and levels (every factor required unless the build is only planned).
 */
export function buildFormSchema(factors: FactorDef[]) {
  return z.preprocess(dropEmpty, buildCreateSchema).superRefine((value, ctx) => {
    for (const issue of checkFactorValues(value.factors ?? {}, factors, { requireAll: (value.status ?? 'built') !== 'planned' })) {
      ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
    }
  });
}

export function buildFormResolver(factors: FactorDef[]): Resolver<BuildFormValues> {
  return zodResolver(buildFormSchema(factors) as never) as unknown as Resolver<BuildFormValues>;
}

/** A new build opens at the usual high-temperature PEM test point: 180 °C, H₂ / air, 25 cm². */
export function newBuildValues(): BuildFormValues {
  return { factors: {}, testConditions: { temperatureC: 180, anodeGas: 'H2', cathodeGas: 'air' }, status: 'built', areaCm2: 25 };
}

/** The values an existing build opens with in the edit form. */
export function buildToForm(b: Build): BuildFormValues {
  return {
    code: b.code,
    parentId: b.parentId,
    changeNote: b.changeNote,
    factors: b.factors,
    loadingMgCm2: b.loadingMgCm2,
    metalLoadingMgCm2: b.metalLoadingMgCm2,
    areaCm2: b.areaCm2,
    catalystLot: b.catalystLot,
    lotId: b.lotId ?? null,
    labId: b.labId,
    status: b.status,
    builtOn: b.builtOn,
    testedOn: b.testedOn,
    replicateOf: b.replicateOf,
    testConditions: b.testConditions,
    responses: b.responses,
    notes: b.notes,
  };
}

/** Drop empty hand-entered responses, factor values and test conditions so the server sees only given values. */
export function cleanBuildInput(values: BuildCreate): BuildCreate {
  const responses = Object.fromEntries(Object.entries(values.responses ?? {}).filter(([, v]) => typeof v === 'number' && Number.isFinite(v)));
  const factors = Object.fromEntries(Object.entries(values.factors ?? {}).filter(([, v]) => v !== undefined && v !== '' && !(typeof v === 'number' && Number.isNaN(v))));
  const testConditions = Object.fromEntries(Object.entries(values.testConditions ?? {}).filter(([, v]) => v !== undefined && v !== '' && v !== null));
  return { ...values, responses, factors, testConditions };
}
