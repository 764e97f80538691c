/**
 * What the review looks at: one tag, the "Confident at" threshold, a range of window ends in
 * whole days on the diary's clocks, and whether confident hits are listed beside the misses.
 */
import type { TagCount } from '../../../../shared/contract';
import { Button } from '../../components/Button';
import { Select } from '../../components/Select';
import { TextField } from '../../components/TextField';
import { INITIAL_SELECTION, parseThreshold, type HindsightSelection, type SelectionProblems } from './selection';
import { ThresholdField } from './ThresholdField';
import { confidentMeaning } from './wording';

export interface HindsightFiltersProps {
  selection: HindsightSelection;
  tags: readonly TagCount[];
  problems: SelectionProblems;
  timeZone: string;
  onChange: (changes: Partial<HindsightSelection>) => void;
}

export function HindsightFilters({ selection, tags, problems, timeZone, onChange }: HindsightFiltersProps) {
  const options = [{ value: '', label: 'All tags' }, ...tags.map((t) => ({ value: t.tag, label: `${t.tag} (${t.count})` }))];
  // A chosen tag stays selectable while the tag list reloads or after its last question went.
  if (selection.tag && !options.some((o) => o.value === selection.tag)) options.push({ value: selection.tag, label: selection.tag });
  const zone = timeZone.replaceAll('_', ' ');
  const threshold = parseThreshold(selection.threshold);
  const thresholdHint = 'value' in threshold ? `Counts a ${confidentMeaning(threshold.value)}` : 'A final forecast this far towards either side';
  const changed =
    selection.tag !== INITIAL_SELECTION.tag ||
    selection.threshold !== INITIAL_SELECTION.threshold ||
    selection.from !== INITIAL_SELECTION.from ||
    selection.to !== INITIAL_SELECTION.to ||
    selection.includeHits !== INITIAL_SELECTION.includeHits;
  return (
    <div role="search" aria-label="Choose which calls to review" className="hs-filters">
      <Select label="Tag" value={selection.tag} options={options} onChange={(tag) => onChange({ tag })} />
      <ThresholdField value={selection.threshold} onChange={(value) => onChange({ threshold: value })} hint={thresholdHint} error={problems.threshold} />
      <TextField
        label="From"
        type="date"
        value={selection.from}
        onChange={(from) => onChange({ from })}
        hint={`Window ended on or after this day (${zone})`}
        error={problems.from}
      />
      <TextField
        label="To"
        type="date"
        value={selection.to}
        onChange={(to) => onChange({ to })}
        hint={`Window ended on or before this day (${zone})`}
        error={problems.to}
      />
      <div className="hs-filters__end">
        <label className="hs-toggle">
          <input type="checkbox" checked={selection.includeHits} onChange={(event) => onChange({ includeHits: event.target.checked })} />
          Show confident hits too
        </label>
        <Button size="sm" variant="ghost" onClick={() => onChange(INITIAL_SELECTION)} disabled={!changed}>
          Reset
        </Button>
      </div>
    </div>
  );
}
