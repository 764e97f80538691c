/**
 * The readable form of `forelog score` (without --json): the headline figures with their
 * sample sizes, in plain words, for a terminal.
 */
import type { ScoreReport } from '../shared/scoring';

const num = (v: number | null, digits = 3): string => (v === null ? '—' : v.toFixed(digits));
const pct = (v: number | null): string => (v === null ? '—' : `${Math.round(v * 100)}%`);

export function formatScoreTable(r: ScoreReport, filterNote: string): string {
  const lines: string[] = [];
  const row = (label: string, value: string, note = '') => lines.push(`  ${label.padEnd(30)} ${value.padStart(9)}  ${note}`.trimEnd());
  lines.push(`Forelog scorecard${filterNote ? ` (${filterNote})` : ''}`);
  lines.push(`  ${r.scored} scored · ${r.unscored} resolved without a counting forecast · ${r.void} void · ${r.open} open`);
  if (r.scored === 0) {
    lines.push('', '  Nothing to score yet: resolve questions that have a forecast made before their window ended.');
    return `${lines.join('\n')}\n`;
  }
  lines.push('', 'Accuracy (lower is better)');
  row('Brier score (final)', num(r.brier), '0 perfect · 0.25 always 50%');
  row('Brier score (time-averaged)', num(r.brier_time_avg));
  row('Log score', num(r.log_score), 'natural log');
  lines.push('', 'Calibration');
  for (const b of r.bins) {
    row(`  said ~${b.index * 10}% (n=${b.n})`, pct(b.observed), `came true; 95% interval ${pct(b.wilson_low)}–${pct(b.wilson_high)}`);
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
  row('Hits / false alarms', `${c.hits} / ${c.false_alarms}`);
  row('Misses / correct rejections', `${c.misses} / ${c.correct_rejections}`);
  row('Hit rate / false alarm rate', `${pct(c.hit_rate)} / ${pct(c.false_alarm_rate)}`);
  row('Cost: your calls', num(c.cost, 2), `base rate ${num(c.cost_base_rate, 2)} · always act ${num(c.cost_always, 2)} · never ${num(c.cost_never, 2)} · foresight 0`);
  if (r.confident_misses.length) {
    lines.push('', 'Confident misses');
    for (const m of r.confident_misses.slice(0, 10)) lines.push(`  ${pct(m.p).padStart(4)} → ${m.outcome.padEnd(3)}  ${m.title}`);
  }
  lines.push('', 'Scores describe past calls; with few questions the intervals are wide.');
  return `${lines.join('\n')}\n`;
}
