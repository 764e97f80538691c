/**
 * The example diary's choice and numeric questions (SCORING.md "Multiple-choice
 * questions", "Numeric questions"; file shape in INTERFACES.md "Question types"), in the
 * same invented world as demo.ts: Quillmere Advisory and its made-up clients, people only
 * by role, every time a day offset from now.
 *
 * Chosen so each new Scorecard section has something to show: resolved choice questions
 * (one ordered, one a confident miss of the top choice), resolved numeric ranges (one
 * wide miss, one date-valued, one with five levels, one revised), open questions of both
 * types, and reference forecasts for both.
 */
import type { QuestionKind } from '../../shared/domain';
import { DEFAULT_QUANTILE_LEVELS } from '../../shared/quantile-levels';

/** [day offset, probability per option, note]. */
type ChoiceRevision = [day: number, probs: number[], note: string];
/** [day offset, value per level, note]; for a date question each value is a day offset too. */
type NumericRevision = [day: number, values: number[], note: string];

interface BaseRow {
  id: string;
  title: string;
  rule: string;
  kind: 'event' | 'state';
  tags: string[];
  open: number;
  close: number;
}

export interface ChoiceRow extends BaseRow {
  type: 'choice';
  options: string[];
  ordered: boolean;
  /** Option base rates and where they come from. */
  base?: [rates: number[], note: string];
  forecasts: ChoiceRevision[];
  refs?: [day: number, probs: number[], source: string][];
  /** [0-based option, day offset, note]. */
  resolved?: [option: number, day: number, note: string];
}

export interface NumericRow extends BaseRow {
  type: 'numeric';
  unit: string;
  /** 'date': every value (forecasts, references, outcome) is a day offset from now. */
  valueKind: 'number' | 'date';
  levels?: number[];
  forecasts: NumericRevision[];
  refs?: [day: number, values: number[], source: string][];
  /** [value, day offset, note]. */
  resolved?: [value: number, day: number, note: string];
}

export type TypedRow = ChoiceRow | NumericRow;

/** What every question of the diary file carries, whatever its type (JSON v1, INTERFACES.md §1). */
export interface DiaryFileQuestionHead {
  id: string;
  title: string;
  rule: string;
  kind: QuestionKind;
  tags: string[];
  opened_at: string;
  closes_at: string;
  time_zone: string;
}

/** A choice question of the diary file (JSON v1, INTERFACES.md "Question types"). */
export interface DiaryFileChoiceQuestion extends DiaryFileQuestionHead {
  type: 'choice';
  options: string[];
  ordered: boolean;
  option_base_rates?: number[];
  base_rate_note?: string;
  forecasts: { at: string; probs: number[]; note: string }[];
  references: { at: string; probs: number[]; source: string }[];
  resolution: { outcome: 'option'; option: number; at: string; note: string } | null;
}

/** A numeric question of the diary file; dates are `YYYY-MM-DD` strings. */
export interface DiaryFileNumericQuestion extends DiaryFileQuestionHead {
  type: 'numeric';
  unit: string;
  value_kind: 'number' | 'date';
  levels: number[];
  forecasts: { at: string; quantiles: (number | string)[]; note: string }[];
  references: { at: string; quantiles: (number | string)[]; source: string }[];
  resolution: { outcome: 'value'; value: number | string; at: string; note: string } | null;
}

export const TYPED_ROWS: TypedRow[] = [
  // ── Choice ──────────────────────────────────────────────────────────────────────
  {
    type: 'choice',
    id: 'demo-wendlebrook-data-platform',
    title: 'Which supplier will Wendlebrook Water pick for the meter-data platform?',
    rule: "Resolves to the supplier named in the contract award notice before the close. 'Neither' if the lot is withdrawn or re-tendered.",
    kind: 'event',
    tags: ['client:wendlebrook', 'procurement'],
    open: -215,
    close: -140,
    options: ['Brackenfold Systems', 'Orrin Metering', 'Neither: withdrawn or re-tendered'],
    ordered: false,
    base: [[0.45, 0.35, 0.2], 'Of 20 utility platform awards we tracked, the technical front-runner won 9 and the runner-up 7; 4 were withdrawn'],
    forecasts: [
      [-215, [0.55, 0.3, 0.15], 'Brackenfold scored best on the technical evaluation and the integrator already works with them. Roughly the base rate for a technical front-runner.'],
      [-185, [0.7, 0.22, 0.08], "Reference-site visit went well. Orrin's price is about 15% higher."],
      [-160, [0.85, 0.12, 0.03], 'The panel chair called Brackenfold "the safe pair of hands" over coffee. Feels settled.'],
    ],
    refs: [[-175, [0.6, 0.3, 0.1], "client's view"]],
    resolved: [1, -142, 'Orrin won on the final price round: they cut a fifth off in the best-and-final offer. I never asked whether there would be a best-and-final stage. Ask about the process, not only the favourite.'],
  },
  {
    type: 'choice',
    id: 'demo-tollmere-booking-slip',
    title: "How late will Tollmere's outpatient booking system go live?",
    rule: "Read off the programme board's go-live notice: the number of weeks between the planned go-live in the baseline plan and the first day live bookings run through the new system.",
    kind: 'state',
    tags: ['client:tollmere', 'delivery'],
    open: -175,
    close: -60,
    options: ['On time', 'Up to 2 weeks late', '2 to 6 weeks late', 'More than 6 weeks late'],
    ordered: true,
    base: [[0.2, 0.25, 0.3, 0.25], "The trust programme office's last twenty go-lives"],
    forecasts: [
      [-175, [0.3, 0.3, 0.25, 0.15], 'Plan looks credible, and the supplier has done this at two other trusts. A little better than the base rate.'],
      [-130, [0.15, 0.3, 0.35, 0.2], 'Integration testing started a fortnight late.'],
      [-100, [0.05, 0.2, 0.5, 0.25], 'Training plan slipped too. After the records system, the go/no-go will be honest this time.'],
    ],
    refs: [[-120, [0.4, 0.35, 0.2, 0.05], 'steering committee']],
    resolved: [2, -58, 'Live five weeks after the baselined date. The ordered options helped: "late, but not very" was the bulk of my forecast.'],
  },
  {
    type: 'choice',
    id: 'demo-hollindales-packaging',
    title: 'Which packaging format will the Hollin Dales board choose for the own-label range?',
    rule: 'Resolves to the format recorded in the board minutes before the close.',
    kind: 'event',
    tags: ['client:hollindales', 'procurement'],
    open: -150,
    close: -90,
    options: ['Recycled plastic tray', 'Card sleeve', 'Keep the current film'],
    ordered: false,
    forecasts: [
      [-150, [0.4, 0.35, 0.25], 'Tray is cheapest to run on the existing line; card is what the retailer keeps hinting at.'],
      [-118, [0.3, 0.55, 0.15], "The retailer's buyer put recyclability in the scoring criteria for the next review."],
    ],
    resolved: [1, -94, 'Card sleeve, with a one-year review. The buyer hint was the signal.'],
  },
  {
    type: 'choice',
    id: 'demo-pellbridge-fraud-vendor',
    title: "Which option will Pellbridge's digital unit pick for fraud scoring?",
    rule: 'Resolves to the option the investment committee approves before the close.',
    kind: 'event',
    tags: ['client:pellbridge', 'procurement'],
    open: -22,
    close: 55,
    options: ['Ferncastle Analytics', 'Tarnwell Data', 'Build it in-house'],
    ordered: false,
    base: [[0.4, 0.4, 0.2], 'Our rough split over the last ten vendor choices we advised on'],
    forecasts: [
      [-22, [0.45, 0.35, 0.2], 'Ferncastle demoed better; Tarnwell is cheaper. The in-house team is keen but stretched.'],
      [-8, [0.5, 0.35, 0.15], 'The in-house team lost two engineers to the payments work.'],
    ],
    refs: [[-12, [0.55, 0.3, 0.15], "client's view"]],
  },
  // ── Numeric ─────────────────────────────────────────────────────────────────────
  {
    type: 'numeric',
    id: 'demo-norrowby-routing-weeks',
    title: "Weeks from kickoff to go-live of Norrowby's route-planning tool",
    rule: 'Whole and part weeks from the kickoff meeting to the first day every depot plans its routes in the new tool, from the programme log.',
    kind: 'event',
    tags: ['client:norrowby', 'delivery'],
    open: -330,
    close: -60,
    unit: 'weeks',
    valueKind: 'number',
    forecasts: [
      [-330, [10, 14, 20], 'The vendor says twelve weeks; their last three roll-outs took fifteen to eighteen.'],
      [-290, [12, 15, 21], 'Data migration scoped and the depot pilots are lined up. Narrowed a little.'],
    ],
    refs: [[-320, [11, 12, 14], 'vendor plan']],
    resolved: [29, -127, 'Live after 29 weeks: the drivers asked for a consultation period nobody had planned for. My 90th percentile assumed nothing outside the project could stop it.'],
  },
  {
    type: 'numeric',
    id: 'demo-wendlebrook-business-case-date',
    title: "When will Wendlebrook's board approve the resubmitted metering business case?",
    rule: 'The date of the board meeting whose minutes record the approval.',
    kind: 'event',
    tags: ['client:wendlebrook', 'delivery'],
    open: -360,
    close: -230,
    unit: '',
    valueKind: 'date',
    forecasts: [
      [-360, [-320, -292, -250], 'The board meets monthly; the new finance director wants the payback re-run first.'],
      [-318, [-300, -288, -262], 'The re-run payback is better than the original. Paper goes to the next board but one.'],
    ],
    resolved: [-287, -285, 'Approved at the board we expected, with a condition on the payback review.'],
  },
  {
    type: 'numeric',
    id: 'demo-tollmere-backlog-count',
    title: "Open incident tickets on Tollmere's clinical systems at the quarter's end",
    rule: "Read off the service desk's quarter-end report: open incidents of any priority on the clinical systems.",
    kind: 'state',
    tags: ['client:tollmere', 'delivery'],
    open: -170,
    close: -90,
    unit: 'tickets',
    valueKind: 'number',
    forecasts: [
      [-170, [180, 240, 320], 'Backlog was 260 and falling by about ten a week.'],
      [-122, [150, 200, 260], 'Two more analysts joined the service desk.'],
    ],
    resolved: [212, -88, 'Quarter-end report: 212 open.'],
  },
  {
    type: 'numeric',
    id: 'demo-quillmere-proposal-hours',
    title: 'Hours we spend on the Halloway Cold Chain proposal',
    rule: 'Sum of timesheet hours booked to the Halloway proposal code until the submission.',
    kind: 'event',
    tags: ['internal', 'pricing'],
    open: -205,
    close: -150,
    unit: 'hours',
    valueKind: 'number',
    levels: [0.05, 0.25, 0.5, 0.75, 0.95],
    forecasts: [[-205, [60, 80, 95, 115, 150], 'Our last three proposals took 70 to 120 hours.']],
    resolved: [52, -151, 'Only 52 hours: we reused most of the Norrowby method section. Reuse is worth asking about at the start.'],
  },
  {
    type: 'numeric',
    id: 'demo-quillmere-fee-income',
    title: 'Fee income for the half-year, in £k',
    rule: 'Read off the management accounts for the half-year ending at the close.',
    kind: 'state',
    tags: ['internal', 'pricing'],
    open: -70,
    close: 100,
    unit: '£k',
    valueKind: 'number',
    forecasts: [
      [-70, [1350, 1480, 1600], 'Pipeline weighted by stage gives about 1,480.'],
      [-28, [1400, 1500, 1600], 'Pellbridge extension signed; the low end moves up.'],
    ],
    refs: [[-25, [1450, 1520, 1580], 'finance plan']],
  },
  {
    type: 'numeric',
    id: 'demo-norrowby-phase3-start',
    title: 'When will phase 3 at Norrowby start?',
    rule: 'The date of the phase-3 kickoff meeting with the client, from the programme log.',
    kind: 'event',
    tags: ['client:norrowby', 'renewals'],
    open: -30,
    close: 120,
    unit: '',
    valueKind: 'date',
    forecasts: [[-30, [20, 42, 80], 'Budget decision first; then two to six weeks to mobilise.']],
  },
];

/** How demo.ts places a row in time (the same clock and seeded minutes as its yes/no rows). */
export interface DemoClock {
  /** The instant `day` days from today at `minutes` past midnight in the diary's zone, as ISO text. */
  at(day: number, minutes: number): string;
  /** A minute of the day drawn from [from, from + span) by the demo's seeded generator. */
  minuteIn(from: number, span: number): number;
  /** The close of a row `day` days from today at 17:00 in the diary's zone, as ISO text. */
  closeAt(day: number): string;
  /** The calendar date `day` days from today in the diary's zone, as `YYYY-MM-DD`. */
  date(day: number): string;
  /** The zone every one of these questions uses. */
  zone: string;
}

const kindOf = (row: TypedRow): QuestionKind => (row.kind === 'event' ? 'event_by_deadline' : 'state_at_deadline');

/**
 * A row as a diary-file question, its times placed as demo.ts places the yes/no ones:
 * opening around 09:00, the first revision a few minutes later, revisions between 08:30
 * and 17:30, references between 10:00 and 17:00, resolutions between 09:30 and 16:30.
 */
export function buildTypedQuestion(row: TypedRow, clock: DemoClock): DiaryFileChoiceQuestion | DiaryFileNumericQuestion {
  const openMinutes = clock.minuteIn(8 * 60 + 45, 60);
  const revisionAt = (day: number) =>
    clock.at(day, day === row.open ? openMinutes + clock.minuteIn(5, 30) : clock.minuteIn(8 * 60 + 30, 9 * 60));
  const referenceAt = (day: number) => clock.at(day, clock.minuteIn(10 * 60, 7 * 60));
  const resolvedAt = (day: number) => clock.at(day, clock.minuteIn(9 * 60 + 30, 7 * 60));
  const common = {
    id: row.id,
    title: row.title,
    rule: row.rule,
    kind: kindOf(row),
    tags: [...row.tags],
    opened_at: clock.at(row.open, openMinutes),
    closes_at: clock.closeAt(row.close),
    time_zone: clock.zone,
  };
  if (row.type === 'choice') {
    const forecasts = row.forecasts.map(([day, probs, note]) => ({ at: revisionAt(day), probs: [...probs], note }));
    const references = (row.refs ?? []).map(([day, probs, source]) => ({ at: referenceAt(day), probs: [...probs], source }));
    const resolution = row.resolved ? { outcome: 'option' as const, option: row.resolved[0], at: resolvedAt(row.resolved[1]), note: row.resolved[2] } : null;
    return {
      type: 'choice',
      ...common,
      options: [...row.options],
      ordered: row.ordered,
      ...(row.base ? { option_base_rates: [...row.base[0]], base_rate_note: row.base[1] } : {}),
      forecasts,
      references,
      resolution,
    };
  }
  const value = (v: number): number | string => (row.valueKind === 'date' ? clock.date(v) : v);
  const forecasts = row.forecasts.map(([day, values, note]) => ({ at: revisionAt(day), quantiles: values.map(value), note }));
  const references = (row.refs ?? []).map(([day, values, source]) => ({ at: referenceAt(day), quantiles: values.map(value), source }));
  const resolution = row.resolved ? { outcome: 'value' as const, value: value(row.resolved[0]), at: resolvedAt(row.resolved[1]), note: row.resolved[2] } : null;
  return {
    type: 'numeric',
    ...common,
    unit: row.unit,
    value_kind: row.valueKind,
    levels: [...(row.levels ?? DEFAULT_QUANTILE_LEVELS)],
    forecasts,
    references,
    resolution,
  };
}
