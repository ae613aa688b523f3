// Curve request schemas: the fields sent with an uploaded file, a confirmed column mapping,
// reading points back, curve options, settling a condition, and import profiles. The server
// validates with them, the OpenAPI document shows them, the client's types come from them.
import { z } from 'zod';
import { projectSettingsSchema } from './project';

export const CURVE_KINDS_UPLOADED = ['polarization', 'durability', 'hold', 'impedance'] as const;

/** The id a browser picks to follow an upload's progress. */
export const UPLOAD_ID_PATTERN = /^[A-Za-z0-9_-]{8,64}$/;
export const UPLOAD_ID_RULE = 'must be 8–64 letters, digits, "-" or "_"';

const unitSpec = z.object({ column: z.number().int().min(0), unit: z.string() });
const impedanceUnit = z.enum(['ohm*cm2', 'mohm*cm2', 'ohm', 'mohm']);

/** A column mapping confirmed by a person: which column is which quantity, in which unit. */
export const mappingSchema = z
  .object({
    current: unitSpec.extend({ unit: z.enum(['A/cm2', 'mA/cm2', 'A', 'mA']), negated: z.boolean().optional() }).optional(),
    voltage: unitSpec.extend({ unit: z.enum(['V', 'mV']) }).optional(),
    voltageIrFree: unitSpec.extend({ unit: z.enum(['V', 'mV']) }).optional(),
    hfr: unitSpec.extend({ unit: z.enum(['ohm*cm2', 'mohm*cm2', 'ohm', 'mohm']) }).optional(),
    time: unitSpec.extend({ unit: z.enum(['s', 'min', 'h', 'timestamp']) }).optional(),
    temperature: unitSpec.extend({ unit: z.enum(['C', 'K']) }).optional(),
    // impedance spectra
    frequency: unitSpec.extend({ unit: z.enum(['Hz', 'kHz', 'MHz', 'rad/s']) }).optional(),
    zReal: unitSpec.extend({ unit: impedanceUnit }).optional(),
    zImag: unitSpec.extend({ unit: impedanceUnit, negatedHeader: z.boolean().optional() }).optional(),
    magnitude: unitSpec.extend({ unit: impedanceUnit }).optional(),
    phase: unitSpec.extend({ unit: z.enum(['deg', 'rad']) }).optional(),
  })
  .refine((mapping) => mapping.voltage !== undefined || mapping.voltageIrFree !== undefined || mapping.frequency !== undefined, { message: 'a voltage column is required (voltage or voltageIrFree), or a frequency column for an impedance spectrum', path: ['voltage'] })
  .refine((mapping) => mapping.frequency === undefined || (mapping.zReal !== undefined && mapping.zImag !== undefined) || (mapping.magnitude !== undefined && mapping.phase !== undefined), { message: 'an impedance spectrum needs zReal and zImag, or magnitude and phase', path: ['zReal'] });

/** A multipart text field holding JSON, checked against a schema. */
const jsonText = <T extends z.ZodType>(schema: T) =>
  z
    .string()
    .transform((text, ctx) => {
      try {
        return JSON.parse(text) as unknown;
      } catch {
        ctx.addIssue({ code: 'custom', message: 'must be JSON' });
        return z.NEVER;
      }
    })
    .pipe(schema);

/** The multipart fields beside the file of POST /api/builds/:id/curves (and …/preview). */
export const uploadFieldsSchema = z.object({
  kind: z.enum(CURVE_KINDS_UPLOADED).optional(),
  areaCm2: z.coerce.number().positive('must be above 0 cm²').max(1000).optional(),
  profileId: z.coerce.number().int().positive().optional(),
  mapping: jsonText(mappingSchema).optional(),
  sheet: z.string().max(100).optional(),
  label: z.string().max(120).optional(),
  saveProfileAs: z.string().trim().min(1).max(80).optional(),
  uploadId: z.string().regex(UPLOAD_ID_PATTERN, UPLOAD_ID_RULE).optional(),
});
/** The upload fields as the server reads them (mapping parsed from its JSON text). */
export type UploadFields = z.output<typeof uploadFieldsSchema>;

export const pointsQuery = z
  .object({
    maxPoints: z.coerce.number().int().min(10).max(100000).optional(),
    fromHours: z.coerce.number().finite().optional(),
    toHours: z.coerce.number().finite().optional(),
  })
  .refine((q) => q.fromHours == null || q.toHours == null || q.toHours >= q.fromHours, { message: 'toHours must not be before fromHours', path: ['toHours'] });

export const curvePatchSchema = z.object({
  label: z.string().trim().max(120).optional(),
  breakInHours: z.number().min(0).nullable().optional(),
  windows: z.array(z.object({ fromHours: z.number().min(0), toHours: z.number().min(0) })).max(20).optional(),
  lossFraction: z.number().gt(0).lt(1).optional(),
  /** accelerated tests: this curve's onset rule over the project's (null: back to the project's) */
  onsetRule: projectSettingsSchema.shape.onsetRule.nullable(),
  /** holds: this curve's settling rule over the project's (null: back to the project's) */
  holdRule: projectSettingsSchema.shape.holdRule.nullable(),
  /** impedance: the equivalent circuit to fit */
  circuit: z.enum(['charge-transfer', 'charge-transfer-diffusion']).optional(),
});
export type CurvePatch = z.infer<typeof curvePatchSchema>;

export const conditionChoiceSchema = z.object({
  field: z.enum(['temperatureC', 'areaCm2', 'anodeGas', 'cathodeGas', 'backPressureKPa']),
  chosen: z.enum(['file', 'build']),
});
export type ConditionChoice = z.infer<typeof conditionChoiceSchema>;

export const importProfileCreateSchema = z.object({
  name: z.string().trim().min(1).max(80),
  labId: z.number().int().positive().nullish(),
  kind: z.enum(CURVE_KINDS_UPLOADED).default('polarization'),
  mapping: z.partialRecord(z.enum(['current', 'voltage', 'voltageIrFree', 'hfr', 'time', 'temperature', 'frequency', 'zReal', 'zImag', 'magnitude', 'phase']), z.object({ header: z.string().min(1), unit: z.string().min(1), negated: z.boolean().optional() })),
});
export type ImportProfileCreate = z.infer<typeof importProfileCreateSchema>;
