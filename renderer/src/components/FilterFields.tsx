/**
 * The filter fields the Scorecard and Hindsight share: one tag, and a range of window ends
 * in whole days on the diary's clocks (turned into instants by `dayRange` in dates.ts).
 */
import type { TagCount } from '../../../shared/contract';
import { formatCount, zoneName } from '../dates';
import { DateField } from './DateField';
import { Select } from './Select';

export function TagFilter({ value, tags, onChange }: { value: string; tags: readonly TagCount[]; onChange: (tag: string) => void }) {
  const options = [{ value: '', label: 'All tags' }, ...tags.map((t) => ({ value: t.tag, label: `${t.tag} (${formatCount(t.count)})` }))];
  // A chosen tag stays selectable while the tag list reloads or after its last question went.
  if (value && !options.some((o) => o.value === value)) options.push({ value, label: value });
  return <Select label="Tag" value={value} options={options} onChange={onChange} />;
}

export interface WindowEndRangeProps {
  from: string;
  to: string;
  timeZone: string;
  problems: { from?: string; to?: string };
  onChange: (changes: { from?: string; to?: string }) => void;
}

export function WindowEndRange({ from, to, timeZone, problems, onChange }: WindowEndRangeProps) {
  const zone = zoneName(timeZone);
  return (
    <>
      <DateField
        label="From"
        value={from}
        onChange={(value) => onChange({ from: value })}
        hint={`Window ended on or after this day (${zone})`}
        error={problems.from}
      />
      <DateField
        label="To"
        value={to}
        onChange={(value) => onChange({ to: value })}
        hint={`Window ended on or before this day (${zone})`}
        error={problems.to}
      />
    </>
  );
}
