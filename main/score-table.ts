/**
 * The readable form of `forelog score` (without --json): the headline figures with their
 * sample sizes, in plain words, for a terminal.
 */
import { groupedDigits } from '../shared/grouped-digits';
import type { ChoiceReport, NumericReport, ScoreReport } from '../shared/scoring';

const num = (v: number | null, digits = 3): string => (v === null ? '—' : v.toFixed(digits));
/** A count, digits grouped: 30,000. */
const count = groupedDigits;
/** Made on first use: the first Intl object of a process costs a start of the command line ~20 ms. */
let COST: Intl.NumberFormat | undefined;
/** A summed cost, digits grouped, two decimals; null is a total larger than a double holds. */
const cost = (v: number | null): string =>
  v === null ? 'too large to add up' : (COST ??= new Intl.NumberFormat('en-GB', { minimumFractionDigits: 2, maximumFractionDigits: 2 })).format(v);
const pct = (v: number | null): string => (v === null ? '—' : `${Math.round(v * 100)}%`);

type Row = (label: string, value: string, note?: string) => void;

/** A headline score's 95 % interval as a note (none when fewer than two questions are scored). */
const interval = (range: [number, number] | null): string => (range === null ? '' : ` · 95% interval ${num(range[0])}–${num(range[1])}`);

const counted = (c: { scored: number; unscored: number; void: number; open: number }) => c.scored + c.unscored + c.void + c.open;
const countsLine = (c: { scored: number; unscored: number; void: number; open: number }) =>
  `  ${count(c.scored)} scored · ${count(c.unscored)} resolved without a counting forecast · ${count(c.void)} void · ${count(c.open)} open`;

/**
 * The scorecard for a terminal. The yes/no figures come first, as they always did; the
 * multiple-choice and numeric sections follow when the selection holds such questions.
 */
export function formatScoreTable(
  r: ScoreReport & { choice?: ChoiceReport; numeric?: NumericReport },
  filterNote: string,
  intervals: { brier: [number, number] | null; log: [number, number] | null },
): string {
  const lines: string[] = [];
  const row: Row = (label, value, note = '') => lines.push(`  ${label.padEnd(30)} ${value.padStart(9)}  ${note}`.trimEnd());
  lines.push(`Forelog scorecard${filterNote ? ` (${filterNote})` : ''}`);
  const choice = r.choice && counted(r.choice) > 0 ? r.choice : null;
  const numeric = r.numeric && counted(r.numeric) > 0 ? r.numeric : null;
  const anyTyped = choice !== null || numeric !== null;
  const onlyTyped = counted(r) === 0 && anyTyped;
  if (!onlyTyped) {
    if (anyTyped) lines.push('', 'Yes/no questions');
    lines.push(countsLine(r));
  }
  if (r.scored === 0) {
    if (!onlyTyped) lines.push('', '  Nothing to score yet: resolve questions that have a forecast made before their window ended.');
    typedSections(lines, row, choice, numeric);
    if (anyTyped) lines.push('', 'Scores describe past calls; with few questions the intervals are wide.');
    return `${lines.join('\n')}\n`;
  }
  lines.push('', 'Accuracy (lower is better)');
  row('Brier score (final)', num(r.brier), `0 perfect · 0.25 always 50%${interval(intervals.brier)}`);
  row('Brier score (time-averaged)', num(r.brier_time_avg));
  row('Log score', num(r.log_score), `natural log${interval(intervals.log)}`);
  lines.push('', 'Calibration');
  for (const b of r.bins) {
    row(`  said ~${b.index * 10}% (n=${count(b.n)})`, pct(b.observed), `came true; 95% interval ${pct(b.wilson_low)}–${pct(b.wilson_high)}`);
  }
  if (r.calibration.slope !== null) {
    row('Calibration slope', num(r.calibration.slope, 2), r.calibration.slope < 1 ? 'below 1: too extreme' : 'above 1: too timid');
    row('Calibration intercept', num(r.calibration.intercept, 2));
  } else row('Calibration slope', '—', r.calibration.reason ?? '');
  const d = r.decomposition;
  row('Reliability', num(d.reliability, 4), 'lower is better');
  row('Resolution', num(d.resolution, 4), 'higher is better');
  row('Uncertainty', num(d.uncertainty, 4));
  lines.push('', 'Discrimination and sharpness');
  row('ROC AUC', num(r.auc), '0.5 no better than chance');
  row('Sharpness', num(r.sharpness), `${pct(r.share_certain)} of calls at exactly 0 or 100%`);
  lines.push('', 'Skill (1 perfect · 0 no better · below 0 worse)');
  row('vs stated base rate', num(r.skill.vs_base_rate));
  row('vs hindsight frequency', num(r.skill.vs_climatology));
  row('vs always 50%', num(r.skill.vs_even));
  row('vs never revising', num(r.skill.vs_first));
  row('vs reference forecasts', num(r.skill.vs_reference));
  const c = r.decisions;
  lines.push('', 'Consequences');
  row('Hits / false alarms', `${count(c.hits)} / ${count(c.false_alarms)}`);
  row('Misses / correct rejections', `${count(c.misses)} / ${count(c.correct_rejections)}`);
  row('Hit rate / false alarm rate', `${pct(c.hit_rate)} / ${pct(c.false_alarm_rate)}`);
  row('Cost: your calls', cost(c.cost), `base rate ${cost(c.cost_base_rate)} · always act ${cost(c.cost_always)} · never ${cost(c.cost_never)} · foresight 0`);
  if (r.confident_misses.length) {
    lines.push('', 'Confident misses');
    for (const m of r.confident_misses.slice(0, 10)) lines.push(`  ${pct(m.p).padStart(4)} → ${m.outcome.padEnd(3)}  ${m.title}`);
  }
  typedSections(lines, row, choice, numeric);
  lines.push('', 'Scores describe past calls; with few questions the intervals are wide.');
  return `${lines.join('\n')}\n`;
}

/** The multiple-choice and numeric sections (SCORING.md), each only when given. */
function typedSections(lines: string[], row: Row, choice: ChoiceReport | null, numeric: NumericReport | null): void {
  if (choice) {
    lines.push('', 'Multiple-choice questions', countsLine(choice));
    if (choice.scored > 0) {
      row('Brier score (multi-category)', num(choice.brier), '0 perfect · 2 worst');
      row('Log score', num(choice.log_score), 'natural log');
      if (choice.rps !== null) row(`Ranked probability score (n=${count(choice.rps_n)})`, num(choice.rps), 'ordered questions');
      row('Skill vs even odds', num(choice.skill.vs_uniform));
      const t = choice.top_choice;
      row('Top choice came true', pct(t.hit_rate), `you gave it ${pct(t.mean_confidence)} on average; 95% interval ${pct(t.wilson_low)}–${pct(t.wilson_high)}`);
    }
  }
  if (numeric) {
    lines.push('', 'Numeric questions', countsLine(numeric));
    for (const c of numeric.coverage) {
      row(`  ${pct(c.level)} ranges (n=${count(c.n)})`, `${count(c.inside)} of ${count(c.n)}`, `caught the outcome (${pct(c.rate)}; 95% interval ${pct(c.wilson_low)}–${pct(c.wilson_high)})`);
    }
  }
}
