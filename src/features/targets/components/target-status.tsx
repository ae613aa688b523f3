// A target's status in words and a shape: "✓ met by C-007 on 11 Sep 2026" or
// "○ not yet — best 605.7 mV (C-018), gap 44.3 mV".
import type { TargetView } from '@shared/api-types';
import { formatDate, formatSignificant } from '@/lib/format';

/** A value in the target's unit with digits that suit the target's own size. */
export function formatTargetValue(value: number | null | undefined, target: Pick<TargetView, 'value' | 'unit'>): string {
  if (value == null || !Number.isFinite(value)) return '—';
  // as many decimals as the target itself shows, plus one, so a gap of a few mV or 0.01 €/cm² reads
  const decimals = Math.min(4, Math.max(0, (String(target.value).split('.')[1]?.length ?? 0) + 1));
  const text = Math.abs(value) >= 1e5 ? formatSignificant(value, 4) : value.toLocaleString('en-GB', { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
  return `${text} ${target.unit}`;
}

/** "V at j_ref ≥ 650 mV (per g catalyst)" */
export function targetStatement(t: TargetView): string {
  const basis = t.basis ? ` per g ${t.basis === 'metal' ? 'metal' : 'catalyst'}` : '';
  return `${t.metricLabel} ${t.comparator === '>=' ? '≥' : '≤'} ${t.value.toLocaleString('en-GB', { maximumFractionDigits: 6 })} ${t.unit}${basis}`;
}

export function TargetStatusText({ target }: { target: TargetView }) {
  const s = target.status;
  if (s.state === 'met' && s.metBy) {
    return (
      <span className="text-ink-900">
        <span aria-hidden="true" className="mr-1 font-semibold text-emerald-700">✓</span>
        met by <span className="num">{s.metBy.code}</span> on {formatDate(s.metBy.date)}
      </span>
    );
  }
  if (s.state === 'not-yet' && s.best) {
    return (
      <span className="text-ink-900">
        <span aria-hidden="true" className="mr-1 text-amber-700">○</span>
        not yet — best <span className="num">{formatTargetValue(s.best.value, target)}</span> ({s.best.code}), gap <span className="num">{formatTargetValue(s.gap, target)}</span>
      </span>
    );
  }
  return (
    <span className="text-ink-500">
      <span aria-hidden="true" className="mr-1">–</span>
      no build measured yet{s.notComparable.length ? ` (${s.notComparable.length} on another basis)` : ''}
    </span>
  );
}

/** The compact list on the project page and home cards. */
export function TargetList({ targets, compact = false }: { targets: TargetView[]; compact?: boolean }) {
  return (
    <ul className={compact ? 'space-y-1 text-xs' : 'space-y-1.5 text-sm'}>
      {targets.map((t) => (
        <li key={t.id}>
          <span className="font-medium text-ink-700">{t.name || targetStatement(t)}</span>
          {t.name && !compact && <span className="text-ink-500"> ({targetStatement(t)}{t.dueDate ? `, due ${formatDate(t.dueDate)}` : ''})</span>}
          {': '}
          <TargetStatusText target={t} />
        </li>
      ))}
    </ul>
  );
}
