// The column-confirmation form's values (a column and a unit per quantity, the curve kind, the
// area, an optional profile name) and the one mapping from them to what the upload sends,
// checked by the upload schemas the server validates with. Kept apart for testing.
import type { Resolver } from 'react-hook-form';
import { z } from 'zod';
import type { UploadPreview } from '@shared/api-types';
import type { ColumnMapping, CurveKind } from '@shared/curves/types';
import { CURVE_KINDS_UPLOADED, mappingSchema, uploadFieldsSchema } from '@shared/schemas/curves';
import { schemaResolver } from '@/lib/schema-form';

export const QUANTITIES = [
  { key: 'current', label: 'Current', units: ['A/cm2', 'mA/cm2', 'A', 'mA'] },
  { key: 'voltage', label: 'Cell voltage', units: ['V', 'mV'] },
  { key: 'voltageIrFree', label: 'iR-free voltage', units: ['V', 'mV'] },
  { key: 'hfr', label: 'HFR', units: ['ohm*cm2', 'mohm*cm2', 'ohm', 'mohm'] },
  { key: 'time', label: 'Time', units: ['s', 'min', 'h', 'timestamp'] },
  { key: 'temperature', label: 'Temperature', units: ['C', 'K'] },
] as const;

/** The columns of an impedance spectrum: Z′ and Z″, or |Z| and phase when that is all a file gives. */
export const IMPEDANCE_QUANTITIES = [
  { key: 'frequency', label: 'Frequency', units: ['Hz', 'kHz', 'MHz', 'rad/s'] },
  { key: 'zReal', label: 'Z′ (real part)', units: ['ohm*cm2', 'mohm*cm2', 'ohm', 'mohm'] },
  { key: 'zImag', label: 'Z″ or −Z″ (sign detected)', units: ['ohm*cm2', 'mohm*cm2', 'ohm', 'mohm'] },
  { key: 'magnitude', label: '|Z| (instead of Z′, Z″)', units: ['ohm*cm2', 'mohm*cm2', 'ohm', 'mohm'] },
  { key: 'phase', label: 'Phase (with |Z|)', units: ['deg', 'rad'] },
] as const;

const ALL_QUANTITIES = [...QUANTITIES, ...IMPEDANCE_QUANTITIES] as const;
export type QuantityKey = (typeof ALL_QUANTITIES)[number]['key'];

/** The quantities a curve of this kind is read from. */
export function quantitiesFor(kind: CurveKind): readonly (typeof ALL_QUANTITIES)[number][] {
  return kind === 'impedance' ? IMPEDANCE_QUANTITIES : QUANTITIES;
}

/** Whether the chosen columns are enough to read a curve of the form's kind. */
export function hasEnoughColumns(v: Pick<MappingFormValues, 'kind' | 'columns'>): boolean {
  const set = (key: QuantityKey) => (v.columns?.[key] ?? '') !== '';
  if (v.kind === 'impedance') return set('frequency') && ((set('zReal') && set('zImag')) || (set('magnitude') && set('phase')));
  return set('voltage') || set('voltageIrFree');
}

export interface MappingFormValues {
  kind: CurveKind;
  sheet: string;
  /** quantity → column index as text, '' for none */
  columns: Record<QuantityKey, string>;
  units: Record<QuantityKey, string>;
  /** the file logs load current as negative */
  negated: boolean;
  /** cm², as typed */
  area: string;
  profileName: string;
}

/** What a confirmed mapping sends with the file. */
export interface MappingChoice {
  mapping: ColumnMapping;
  kind: CurveKind;
  areaCm2?: number;
  sheet?: string;
  saveProfileAs?: string;
}

/** The upload fields a confirmation sets, each as the server checks it. */
const mappingChoiceSchema = z.object({
  mapping: mappingSchema,
  kind: z.enum(CURVE_KINDS_UPLOADED),
  areaCm2: uploadFieldsSchema.shape.areaCm2,
  sheet: uploadFieldsSchema.shape.sheet,
  saveProfileAs: uploadFieldsSchema.shape.saveProfileAs,
});

/** The form as it opens: the columns the reader detected; the file's own area first, else the build's. */
export function initialMappingValues(preview: UploadPreview): MappingFormValues {
  const detected = (preview.detected ?? {}) as Partial<Record<QuantityKey, { column: number; unit: string; negated?: boolean }>>;
  const area = preview.conditions?.areaCm2 ?? preview.buildAreaCm2 ?? null;
  return {
    kind: preview.kind,
    sheet: preview.sheet ?? '',
    columns: Object.fromEntries(ALL_QUANTITIES.map((q) => [q.key, detected[q.key] ? String(detected[q.key]!.column) : ''])) as Record<QuantityKey, string>,
    units: Object.fromEntries(ALL_QUANTITIES.map((q) => [q.key, detected[q.key]?.unit ?? q.units[0]])) as Record<QuantityKey, string>,
    negated: detected.current?.negated === true,
    area: area != null ? String(area) : '',
    profileName: '',
  };
}

/** A total current or a total resistance needs the active area to become per cm². */
export const needsArea = (v: Pick<MappingFormValues, 'columns' | 'units'> & { kind?: CurveKind }) => {
  const total = (key: QuantityKey) => (v.columns?.[key] ?? '') !== '' && ['ohm', 'mohm'].includes(v.units?.[key] ?? '');
  if (v.kind === 'impedance') return total('zReal') || total('magnitude');
  return ((v.columns?.current ?? '') !== '' && ['A', 'mA'].includes(v.units?.current ?? '')) || total('hfr');
};

export function mappingChoiceFrom(values: MappingFormValues): MappingChoice {
  const mapping: Record<string, { column: number; unit: string; negated?: boolean }> = {};
  for (const q of quantitiesFor(values.kind)) {
    const column = values.columns?.[q.key] ?? '';
    if (column === '') continue;
    mapping[q.key] = { column: Number(column), unit: values.units[q.key] };
  }
  if (mapping.current && values.negated) mapping.current.negated = true;
  const area = values.area.trim();
  return {
    mapping: mapping as unknown as ColumnMapping,
    kind: values.kind,
    areaCm2: area === '' ? undefined : Number(area.replace(',', '.')),
    sheet: values.sheet || undefined,
    saveProfileAs: values.profileName.trim() || undefined,
  };
}

function fieldOf(path: PropertyKey[]): string {
  const [head, quantity, part] = path.map(String);
  if (head === 'mapping' && quantity) return part === 'unit' ? `units.${quantity}` : `columns.${quantity}`;
  if (head === 'areaCm2') return 'area';
  if (head === 'saveProfileAs') return 'profileName';
  if (head === 'kind' || head === 'sheet') return head;
  return 'root';
}

export const mappingResolver: Resolver<MappingFormValues> = schemaResolver<MappingFormValues, MappingChoice>({
  schema: mappingChoiceSchema as unknown as z.ZodType<MappingChoice>,
  toBody: mappingChoiceFrom,
  fieldOf,
});
