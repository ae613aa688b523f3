// Project, factor and response schemas shared by the client forms, the server's validation
// and the OpenAPI document. One definition, three uses.
import { z } from 'zod';

export const ROLES = ['pi', 'researcher', 'partner', 'viewer'] as const;
export type ProjectRole = (typeof ROLES)[number];

export const projectSettingsSchema = z.object({
  refCurrentDensity: z.number().positive('must be above 0 A/cm²').max(5, 'must be at most 5 A/cm²'),
  refVoltage: z.number().positive('must be above 0 V').max(1.3, 'must be at most 1.3 V'),
  irFree: z.boolean(),
  loadingBasis: z.enum(['catalyst', 'metal']),
  /** the rule for the onset of rapid failure in accelerated tests (any number left out: the default) */
  onsetRule: z
    .object({
      startHours: z.number().min(0),
      blockHours: z.number().positive().max(100),
      minRateRatio: z.number().min(1).max(100),
      minRateIncreaseUvPerH: z.number().min(0).max(100000),
      alpha: z.number().gt(0).lt(0.5),
      minStableHours: z.number().positive().max(100000),
      minTailHours: z.number().positive().max(100000),
      currentTolerance: z.number().gt(0).lt(1),
    })
    .partial()
    .optional(),
  /** the settling rule of open-circuit holds (any number left out: the default) */
  holdRule: z.object({ settleMinutes: z.number().min(0).max(1440), edgeMinutes: z.number().positive().max(1440), confidence: z.number().gt(0.5).lt(1) }).partial().optional(),
  /** precious-metal prices entered by the team (never fetched), newest used per metal */
  metalPrices: z
    .array(
      z.object({
        metal: z.string().trim().min(1).max(20),
        pricePerGram: z.number().positive('must be above 0').max(1e6),
        currency: z.string().trim().min(1).max(8),
        date: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date as YYYY-MM-DD'),
        source: z.string().trim().min(1, 'say where the price came from').max(200),
      }),
    )
    .max(20)
    .optional(),
});
export type ProjectSettings = z.infer<typeof projectSettingsSchema>;

/** PUT /api/projects/:id/metal-prices: the whole list of prices (one currency, each metal once). */
export const metalPricesSchema = z.object({ prices: projectSettingsSchema.shape.metalPrices.unwrap() });
export type MetalPricesBody = z.infer<typeof metalPricesSchema>;

export const DEFAULT_SETTINGS: ProjectSettings = {
  refCurrentDensity: 0.2,
  refVoltage: 0.6,
  irFree: true,
  loadingBasis: 'catalyst',
};

export const projectCreateSchema = z.object({
  name: z.string().trim().min(3, 'at least 3 characters').max(120),
  description: z.string().trim().max(2000).default(''),
  codePrefix: z.string().trim().regex(/^[A-Z]{1,4}$/, '1–4 capital letters, e.g. B').default('B'),
  settings: projectSettingsSchema.default(DEFAULT_SETTINGS),
});
export type ProjectCreate = z.input<typeof projectCreateSchema>;

export const projectUpdateSchema = z.object({
  name: z.string().trim().min(3, 'at least 3 characters').max(120).optional(),
  description: z.string().trim().max(2000).optional(),
  codePrefix: z.string().trim().regex(/^[A-Z]{1,4}$/, '1–4 capital letters, e.g. B').optional(),
  settings: projectSettingsSchema.optional(),
});

const keyRule = z
  .string()
  .trim()
  .regex(/^[a-zA-Z][a-zA-Z0-9_]{0,39}$/, 'a letter, then letters, digits or _ (max 40)');

export const factorCreateSchema = z
  .object({
    key: keyRule,
    label: z.string().trim().min(1, 'required').max(80),
    unit: z.string().trim().max(20).default(''),
    kind: z.enum(['continuous', 'categorical']),
    low: z.number().finite().nullish(),
    high: z.number().finite().nullish(),
    levels: z.array(z.string().trim().min(1).max(60)).nullish(),
    testVariable: z.boolean().default(false).describe('true when the factor is a test condition (cell temperature, pressure, gas, stoichiometry) rather than part of the electrode'),
  })
  .superRefine((f, ctx) => {
    if (f.kind === 'continuous') {
      if (f.low == null) ctx.addIssue({ code: 'custom', path: ['low'], message: 'a continuous factor needs a low bound' });
      if (f.high == null) ctx.addIssue({ code: 'custom', path: ['high'], message: 'a continuous factor needs a high bound' });
      if (f.low != null && f.high != null && !(f.low < f.high))
        ctx.addIssue({ code: 'custom', path: ['high'], message: 'high must be greater than low' });
    } else {
      const levels = f.levels ?? [];
      if (levels.length < 2) ctx.addIssue({ code: 'custom', path: ['levels'], message: 'a categorical factor needs at least 2 levels' });
      if (new Set(levels).size !== levels.length) ctx.addIssue({ code: 'custom', path: ['levels'], message: 'levels must be distinct' });
    }
  });
export type FactorCreate = z.input<typeof factorCreateSchema>;

export interface FactorDef {
  id: number;
  key: string;
  label: string;
  unit: string;
  kind: 'continuous' | 'categorical';
  low: number | null;
  high: number | null;
  levels: string[] | null;
  /** a test condition rather than part of the electrode */
  testVariable: boolean;
}

export const responseCreateSchema = z.object({
  key: keyRule,
  label: z.string().trim().min(1, 'required').max(80),
  unit: z.string().trim().max(20).default(''),
  goal: z.enum(['maximize', 'minimize', 'target']),
  target: z.number().finite().nullish(),
});
export type ResponseCreate = z.input<typeof responseCreateSchema>;

export interface ResponseDef {
  id: number;
  key: string;
  label: string;
  unit: string;
  goal: 'maximize' | 'minimize' | 'target';
  target: number | null;
}

export const testConditionsSchema = z.object({
  temperatureC: z.number().min(-20, 'below −20 °C').max(300, 'above 300 °C').nullish(),
  anodeGas: z.string().trim().max(40).nullish(),
  cathodeGas: z.string().trim().max(40).nullish(),
  backPressureKPa: z.number().min(0).max(1000).nullish(),
  anodeStoich: z.number().min(0).max(20).nullish(),
  cathodeStoich: z.number().min(0).max(20).nullish(),
  /** H₂ crossover current density, mA/cm² (e.g. from a linear sweep on H₂/N₂); added to j for the kinetic metrics */
  h2CrossoverMAcm2: z.number().min(0, 'below 0 mA/cm²').max(50, 'above 50 mA/cm²').nullish(),
});
export type TestConditions = z.infer<typeof testConditionsSchema>;

/** PUT /api/projects/:id/notify: my own e-mail notices for the project (each event, or a daily digest). */
export const notifySchema = z.object({ notify: z.boolean(), digest: z.boolean().optional() });
export type NotifyBody = z.infer<typeof notifySchema>;
