/**
 * What the review looks at: one tag, the "Confident at" threshold, a range of window ends in
 * whole days on the diary's clocks, and whether confident hits are listed beside the misses.
 */
import type { TagCount } from '../../../../shared/contract';
import { Button } from '../../components/Button';
import { TagFilter, WindowEndRange } from '../../components/FilterFields';
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
      <TagFilter value={selection.tag} tags={tags} onChange={(tag) => onChange({ tag })} />
      <ThresholdField value={selection.threshold} onChange={(value) => onChange({ threshold: value })} hint={thresholdHint} error={problems.threshold} />
      <WindowEndRange from={selection.from} to={selection.to} timeZone={timeZone} problems={problems} onChange={onChange} />
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
