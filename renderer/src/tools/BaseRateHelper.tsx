/**
 * "Work out a base rate": a small disclosure under a question form's base-rate field. From
 * k of n comparable cases it gives the rule-of-succession estimate with its 95% Jeffreys
 * interval; from a rate per period it gives the chance of at least one event in the window
 * (constant hazard). "Use this" fills the form's base rate and its reference-class note.
 * The maths is shared/scoring's; this component only collects numbers and words.
 */
import { useId, useState, type KeyboardEvent } from 'react';
import { rateToWindow, ruleOfSuccession } from '../../../shared/scoring';
import { Button } from '../components/Button';
import { ChoiceGroup } from '../components/ChoiceGroup';
import { NumberField } from '../components/NumberField';
import { Select } from '../components/Select';
import { TextField } from '../components/TextField';
import { formatCount } from '../dates';
import { estimateText, formatEstimate, formatRange, numberOrNull, plural } from './format';
import './tools.css';

type Mode = 'cases' | 'rate';

const MODES = [
  { value: 'cases', label: 'k of n comparable cases' },
  { value: 'rate', label: 'a rate per period' },
] as const;

/** Period lengths in days, for reading the question's own window in the chosen unit. */
const PERIODS = {
  day: 1,
  week: 7,
  month: 365.25 / 12,
  quarter: 365.25 / 4,
  year: 365.25,
} as const;
type Period = keyof typeof PERIODS;
const PERIOD_OPTIONS = (Object.keys(PERIODS) as Period[]).map((p) => ({ value: p, label: p }));

/** Counts beyond this are typos, not reference classes (and would slow the interval down). */
const MAX_CASES = 10_000_000;

export interface BaseRateHelperProps {
  /** Fills the form: the base rate as percent text, and the reference-class note. */
  onUse: (percentText: string, note: string) => void;
  /** The question's window in days, when the form knows it; offered as the window length. */
  windowDays?: number | null | undefined;
}

interface Outcome {
  p: number;
  headline: string;
  explanation: string;
  note: string;
}

type Checked = { outcome: Outcome | null; errors: Record<string, string> };

function checkCases(kText: string, nText: string, what: string): Checked {
  const k = numberOrNull(kText);
  const n = numberOrNull(nText);
  const errors: Record<string, string> = {};
  if (kText.trim() !== '' && (k === null || !Number.isInteger(k) || k < 0)) errors.k = 'Must be a whole number of cases, 0 or more';
  if (nText.trim() !== '' && (n === null || !Number.isInteger(n) || n < 0)) errors.n = 'Must be a whole number of cases, 0 or more';
  else if (n !== null && n > MAX_CASES) errors.n = `Must be at most ${formatCount(MAX_CASES)} cases`;
  if (!errors.k && !errors.n && k !== null && n !== null && k > n) errors.k = 'Can’t be more than the comparable cases';
  if (k === null || n === null || Object.keys(errors).length) return { outcome: null, errors };
  const { estimate, low, high } = ruleOfSuccession(k, n);
  const counted = `${formatCount(k)} of ${formatCount(n)} comparable`;
  const cases = `${counted} ${what.trim() || 'cases'}`;
  const interval = formatRange(low, high);
  return {
    errors,
    outcome: {
      p: estimate,
      headline: `${cases} → ${formatEstimate(estimate)} (95% interval ${interval})`,
      explanation:
        'Rule of succession, (k + 1) / (n + 2): it never says 0% or 100% from a few cases. The interval is where the underlying rate plausibly lies; few cases give a wide one.',
      note: `${cases}; rule of succession, 95% interval ${interval}`,
    },
  };
}

function checkRate(rateText: string, windowText: string, period: Period): Checked {
  const rate = numberOrNull(rateText);
  const length = numberOrNull(windowText);
  const errors: Record<string, string> = {};
  if (rateText.trim() !== '' && (rate === null || rate < 0)) errors.rate = 'Must be a number of events, 0 or more';
  if (windowText.trim() !== '' && (length === null || length < 0)) errors.window = `Must be a number of ${period}s, 0 or more`;
  if (rate === null || length === null || Object.keys(errors).length) return { outcome: null, errors };
  const p = rateToWindow(rate, length);
  const span = `${rate} per ${period} over ${plural(length, period)}`;
  return {
    errors,
    outcome: {
      p,
      headline: `${span} → ${formatEstimate(p)}`,
      explanation: 'The chance of at least one event in the window if events arrive at a steady rate (constant hazard): 1 − e^(−rate × window).',
      note: `${span}; constant hazard, 1 − e^(−rate × window)`,
    },
  };
}

/** Enter in a helper box must not submit the question form around it. */
function keepEnter(event: KeyboardEvent<HTMLDivElement>) {
  if (event.key === 'Enter' && event.target instanceof HTMLInputElement) event.preventDefault();
}

export function BaseRateHelper({ onUse, windowDays }: BaseRateHelperProps) {
  const statusId = useId();
  const [mode, setMode] = useState<Mode>('cases');
  const [k, setK] = useState('');
  const [n, setN] = useState('');
  const [what, setWhat] = useState('');
  const [rate, setRate] = useState('');
  const [period, setPeriod] = useState<Period>('year');
  const [windowLength, setWindowLength] = useState('');
  // What was last filled in; the confirmation shows only while the result still reads the same.
  const [usedFor, setUsedFor] = useState('');

  const checked = mode === 'cases' ? checkCases(k, n, what) : checkRate(rate, windowLength, period);
  const outcome = checked.outcome;
  const ownWindow = windowDays && windowDays > 0 ? Number((windowDays / PERIODS[period]).toFixed(2)) : 0;

  function use() {
    if (!outcome) return;
    onUse(estimateText(outcome.p), outcome.note);
    setUsedFor(outcome.headline);
  }

  return (
    <details className="tool" data-testid="base-rate-helper">
      <summary className="tool__summary">Work out a base rate</summary>
      <div className="tool__body" onKeyDown={keepEnter}>
        <ChoiceGroup legend="From" value={mode} choices={MODES} onChange={(value) => setMode(value as Mode)} />
        {mode === 'cases' ? (
          <div className="tool__row">
            <NumberField label="Cases where it happened" value={k} onChange={setK} min={0} step={1} error={checked.errors.k} />
            <NumberField label="Comparable cases" value={n} onChange={setN} min={0} step={1} error={checked.errors.n} />
            <TextField label="What the cases were" value={what} onChange={setWhat} placeholder="e.g. renewals slipped" hint="Optional; goes into the note." />
          </div>
        ) : (
          <div className="tool__row">
            <NumberField label="Events per period" value={rate} onChange={setRate} min={0} step="any" error={checked.errors.rate} />
            <Select label="Period" value={period} options={PERIOD_OPTIONS} onChange={(value) => setPeriod(value as Period)} />
            <NumberField
              label="Window length"
              value={windowLength}
              onChange={setWindowLength}
              min={0}
              step="any"
              suffix={`${period}s`}
              error={checked.errors.window}
            />
            {ownWindow > 0 ? (
              <div className="tool__aside">
                <Button size="sm" variant="ghost" onClick={() => setWindowLength(String(ownWindow))}>
                  Use this question’s window ({plural(ownWindow, period)})
                </Button>
              </div>
            ) : null}
          </div>
        )}
        {outcome ? (
          <div className="tool__result" data-testid="base-rate-result" data-p={outcome.p}>
            <p className="tool__headline">{outcome.headline}</p>
            <p className="tool__explain">{outcome.explanation}</p>
            <div>
              <Button size="sm" variant="primary" onClick={use} aria-describedby={statusId}>
                Use this
              </Button>
            </div>
          </div>
        ) : (
          <p className="tool__explain">
            {mode === 'cases' ? 'Enter how many comparable cases there were and in how many it happened.' : 'Enter the rate and the window length in the same period.'}
          </p>
        )}
        <p id={statusId} role="status" className="tool__status">
          {outcome && usedFor === outcome.headline ? `Base rate set to ${formatEstimate(outcome.p)}, with the reference class noted.` : ''}
        </p>
      </div>
    </details>
  );
}
