/**
 * The Scorecard's filters: one tag, and a range of window ends in whole days on the diary's
 * clocks. Every figure on the screen follows them.
 */
import type { TagCount } from '../../../../shared/contract';
import { Button } from '../../components/Button';
import { Select } from '../../components/Select';
import { TextField } from '../../components/TextField';
import type { FilterProblems, ScorecardFilter } from './filterRequest';

export interface FiltersProps {
  filter: ScorecardFilter;
  tags: readonly TagCount[];
  problems: FilterProblems;
  timeZone: string;
  onChange: (changes: Partial<ScorecardFilter>) => void;
}

export function Filters({ filter, tags, problems, timeZone, onChange }: FiltersProps) {
  const options = [{ value: '', label: 'All tags' }, ...tags.map((t) => ({ value: t.tag, label: `${t.tag} (${t.count})` }))];
  // A chosen tag stays selectable while the tag list reloads or after its last question went.
  if (filter.tag && !options.some((o) => o.value === filter.tag)) options.push({ value: filter.tag, label: filter.tag });
  const zone = timeZone.replaceAll('_', ' ');
  const filtered = filter.tag !== '' || filter.from !== '' || filter.to !== '';
  return (
    <div role="search" aria-label="Filter the scorecard" className="sc-filters">
      <Select label="Tag" value={filter.tag} options={options} onChange={(tag) => onChange({ tag })} />
      <TextField
        label="From"
        type="date"
        value={filter.from}
        onChange={(from) => onChange({ from })}
        hint={`Window ended on or after this day (${zone})`}
        error={problems.from}
      />
      <TextField
        label="To"
        type="date"
        value={filter.to}
        onChange={(to) => onChange({ to })}
        hint={`Window ended on or before this day (${zone})`}
        error={problems.to}
      />
      <Button className="sc-filters__clear" onClick={() => onChange({ tag: '', from: '', to: '' })} disabled={!filtered}>
        Clear filters
      </Button>
    </div>
  );
}
