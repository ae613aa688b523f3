// The options of a response picker: the curve metrics in their display units, then the project's
// hand-entered responses. Goes inside a <Select>.
import type { ResponseDef } from '@shared/api-types';
import { METRICS } from '@/lib/format';

export function ResponseOptions({ responses }: { responses: Pick<ResponseDef, 'key' | 'label' | 'unit'>[] }) {
  return (
    <>
      <optgroup label="From curves">
        {Object.values(METRICS).map((m) => <option key={m.key} value={m.key}>{m.label}{m.unit ? ` (${m.unit})` : ''}</option>)}
      </optgroup>
      {responses.length > 0 && (
        <optgroup label="Entered by hand">
          {responses.map((r) => <option key={r.key} value={r.key}>{r.label}{r.unit ? ` (${r.unit})` : ''}</option>)}
        </optgroup>
      )}
    </>
  );
}
