/**
 * The Scorecard's filters: one tag, and a range of window ends in whole days on the diary's
 * clocks. Every figure on the screen follows them.
 */
import type { TagCount } from '../../../../shared/contract';
import { Button } from '../../components/Button';
import { TagFilter, WindowEndRange } from '../../components/FilterFields';
import type { FilterProblems, ScorecardFilter } from './filterRequest';

export interface FiltersProps {
  filter: ScorecardFilter;
  tags: readonly TagCount[];
  problems: FilterProblems;
  timeZone: string;
  onChange: (changes: Partial<ScorecardFilter>) => void;
}

export function Filters({ filter, tags, problems, timeZone, onChange }: FiltersProps) {
  const filtered = filter.tag !== '' || filter.from !== '' || filter.to !== '';
  return (
    <div role="search" aria-label="Filter the scorecard" className="sc-filters">
      <TagFilter value={filter.tag} tags={tags} onChange={(tag) => onChange({ tag })} />
      <WindowEndRange from={filter.from} to={filter.to} timeZone={timeZone} problems={problems} onChange={onChange} />
      <Button className="sc-filters__clear" onClick={() => onChange({ tag: '', from: '', to: '' })} disabled={!filtered}>
        Clear filters
      </Button>
    </div>
  );
}
