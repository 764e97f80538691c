/**
 * The Briefing: a printable, self-contained HTML report for one tag (PRODUCT.md
 * "Hindsight review and briefing"), read or printed to PDF before a new engagement.
 *
 * Self-contained on purpose: one <style> element and inline SVG, no script, no external
 * resource and no style attribute, so the document prints the same anywhere and a strict
 * Content-Security-Policy can admit it with one hash (`BRIEFING_STYLE_HASH`, briefing-style.ts).
 *
 * The figures come from the caller's `ScoreReport`; which call was confident is decided
 * from the questions by the scoring engine's own counting rules (SCORING.md "Which
 * forecasts count": window end T = min(close, resolution), final forecast = the latest
 * forecast at or before T, same time → the one entered last), through
 * `computeScorecardDetail`, so the briefing and the Scorecard cannot disagree.
 */
import { BRIEFING_CSS } from './briefing-style';
import { isBinary, type BinaryQuestion, type NumericValue, type Question, type ValueKind } from '../../shared/domain';
import {
  confidentVerdict,
  computeScorecardDetail,
  recalibrate,
  windowEnd,
  type ReportBin,
  type ScoreReport,
  type ScorecardDetail,
  type ScoredQuestionRow,
  type ScoringQuestion,
} from '../../shared/scoring';
import type { ChoiceHindsightEntry, NumericHindsightEntry } from '../../shared/hindsight-entries';
import { isValidTimeZone, parseInstant } from '../../shared/time';

/** Probability the calibration reading translates ("your 90% behaves like …", PRODUCT.md). */
const READING_P = 0.9;

// Locale fixed to British English: day-month-year with a named month reads unambiguously
// to any English reader, and the same diary always prints the same text.
const LOCALE = 'en-GB';


export interface BriefingInput {
  /** The tag the briefing is about; null for the whole diary. */
  tag: string | null;
  /** When the briefing is made (epoch ms). */
  generated_at: number;
  /** IANA zone of the reader: the generated date and every diary date are shown in it. */
  time_zone: string;
  /** The scorecard for the same tag (`score` with `{ tag }`). */
  report: ScoreReport;
  /**
   * The tag's yes/no questions as scored: `computeScorecardDetail` over them (per-question
   * rows included) and the engine's input it came from (for the base-rate and reference
   * counts). The scoring rules are the engine's; the briefing only selects and shows.
   */
  scored: { detail: ScorecardDetail; questions: readonly ScoringQuestion[] };
  /** The full yes/no questions of some ids, called once for the confident calls the briefing shows. */
  details: (ids: string[]) => BinaryQuestion[];
  /** The tag's open questions (all when tag is null), of every type. */
  open: Question[];
  /**
   * Confident = final forecast ≥ threshold on a No, or ≤ 1 − threshold on a Yes (a miss),
   * and the mirror image for a hit. From 0.5 to 1; INTERFACES.md §2 uses 0.8. At 0.5 a
   * final 50 % is on both sides and so counts as a miss whatever happened, as the rule reads.
   */
  threshold: number;
  /** Choice questions of the same tag whose top choice was held at the threshold and missed (hindsight-types.ts), worst first. */
  choice_misses: ChoiceHindsightEntry[];
  /** Numeric questions of the same tag whose outcome fell outside the final range (hindsight-types.ts), largest first. */
  numeric_surprises: NumericHindsightEntry[];
}

/** Confident hits are shown after the misses and capped: the misses are what the briefing is for. */
export const MAX_CONFIDENT_HITS = 5;


// ── Text helpers ────────────────────────────────────────────────────────────────────────

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Escapes text for HTML content and quoted attribute values (titles and notes are user text). */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ESCAPES[c]!);
}

/**
 * A probability as a whole percentage. Rounded on the decimal value (0.285 → 29 %, not
 * the 28 % that 0.285 × 100 = 28.4999… would give); a value strictly between 0 and 1 that
 * would round to 0 % or 100 % is shown as "<1%" or ">99%", so only certainty reads as such.
 */
export function wholePercent(p: number): string {
  const r = Math.round(Number((p * 100).toFixed(9)));
  if (r === 0 && p > 0) return '<1%';
  if (r === 100 && p < 1) return '>99%';
  return `${r}%`;
}

/** A score to `digits` decimals with a true minus sign, and a plus sign when asked. */
function fixed(v: number, digits: number, signed = false): string {
  const text = v.toFixed(digits);
  if (text.startsWith('-')) return /^-0\.0*$/.test(text) ? text.slice(1) : `−${text.slice(1)}`;
  return signed && Number(text) !== 0 ? `+${text}` : text;
}

function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

const formats = new Map<string, Intl.DateTimeFormat>();

function dateFormat(timeZone: string, kind: 'long' | 'entry' | 'close'): Intl.DateTimeFormat {
  const key = `${kind}|${timeZone}`;
  let f = formats.get(key);
  if (!f) {
    f = new Intl.DateTimeFormat(LOCALE, {
      timeZone,
      day: 'numeric',
      month: kind === 'long' ? 'long' : 'short',
      year: 'numeric',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
      ...(kind === 'entry' ? {} : { timeZoneName: 'short' }),
    });
    formats.set(key, f);
  }
  return f;
}

function instant(iso: string, what: string): number {
  const ms = parseInstant(iso);
  if (ms === null) {
    throw new RangeError(`renderBriefing: ${what} is ${JSON.stringify(iso)}, not an ISO 8601 instant; pass the question as getQuestion returns it.`);
  }
  return ms;
}

// ── Selecting the confident calls ───────────────────────────────────────────────────────

function toScoringQuestion(q: BinaryQuestion): ScoringQuestion {
  return {
    id: q.id,
    title: q.title,
    tags: q.tags,
    kind: q.kind,
    closes_at: instant(q.closes_at, `question ${q.id} closes_at`),
    resolution: q.resolution ? { outcome: q.resolution.outcome, at: instant(q.resolution.at, `question ${q.id} resolution time`) } : null,
    base_rate: q.base_rate,
    costs: q.costs,
    forecasts: q.forecasts.map((f) => ({ at: instant(f.at, `question ${q.id} forecast time`), p: f.p, seq: f.seq })),
    references: q.references.map((r) => ({ at: instant(r.at, `question ${q.id} reference time`), p: r.p })),
  };
}

interface ConfidentCall {
  row: ScoredQuestionRow;
  question: BinaryQuestion;
}

/** How far the final forecast was from the outcome, |p − o|. */
const error = (row: ScoredQuestionRow): number => Math.abs(row.p - (row.outcome === 'yes' ? 1 : 0));

/**
 * Splits the scored questions into confident misses (worst first, then by id, the order
 * of `ScoreReport.confident_misses`) and confident hits (most recent window end first).
 * Which calls are confident, and misses or hits, is `confidentVerdict`'s rule.
 */
function confidentRows(rows: readonly ScoredQuestionRow[], threshold: number) {
  const misses: ScoredQuestionRow[] = [];
  const hits: ScoredQuestionRow[] = [];
  for (const row of rows) {
    const verdict = confidentVerdict(row.p, row.outcome === 'yes' ? 1 : 0, threshold);
    if (verdict === 'miss') misses.push(row);
    else if (verdict === 'hit') hits.push(row);
  }
  misses.sort((a, b) => error(b) - error(a) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  hits.sort((a, b) => b.T - a.T || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  return { misses, hits };
}

/**
 * What `renderBriefing` reads about the questions, made from full questions (as
 * getQuestion answers them), the tag's alone; costs enter no figure a briefing shows. The
 * service gives the same from its own scoring input instead, which a large diary has
 * ready; a test checks the two documents are the same.
 */
export function briefingSources(questions: readonly Question[], tag: string | null): Pick<BriefingInput, 'scored' | 'details' | 'open'> {
  const ofTag = tag === null ? questions : questions.filter((q) => q.tags.includes(tag));
  const binary = ofTag.filter(isBinary);
  const scoring = binary.map(toScoringQuestion);
  const byId = new Map(binary.map((q) => [q.id, q]));
  return {
    scored: { detail: computeScorecardDetail(scoring, { default_costs: { false_alarm: 1, miss: 1 } }), questions: scoring },
    details: (ids) => ids.map((id) => byId.get(id)!),
    open: ofTag.filter((q) => q.resolution === null),
  };
}

// ── Sections ────────────────────────────────────────────────────────────────────────────

interface Context {
  input: BriefingInput;
  subject: string;
  brierInterval: [number, number] | null;
  logInterval: [number, number] | null;
  /** Scored questions with a stated base rate, and with a reference forecast at or before T. */
  withBaseRate: number;
  withReference: number;
}

function header(ctx: Context): string {
  const { report, generated_at, time_zone } = ctx.input;
  const counts = [
    `<strong>${report.scored}</strong> scored`,
    `<strong>${report.void}</strong> void`,
    `<strong>${report.open}</strong> open`,
  ];
  if (report.unscored > 0) counts.push(`<strong>${report.unscored}</strong> resolved without a forecast in the window`);
  return `<header class="masthead">
<p class="kicker">Forelog · Hindsight briefing</p>
<h1>Briefing: ${escapeHtml(ctx.subject)}</h1>
<p class="meta">Generated ${escapeHtml(dateFormat(time_zone, 'long').format(generated_at))}</p>
<p class="meta counts" id="counts">${counts.join(' · ')}</p>
<p class="caution" id="caution">Scores describe past calls, not future ones. With n = ${report.scored} the intervals are wide.</p>
</header>`;
}

function interval(iv: [number, number] | null, digits: number): string {
  return iv === null ? '' : ` (95% interval ${fixed(iv[0], digits)}–${fixed(iv[1], digits)})`;
}

/** The Brier sentence the scorecard opens with; null before anything is scored. */
function brierHeadline(report: ScoreReport, brierInterval: [number, number] | null): string | null {
  if (report.brier === null) return null;
  return `Brier ${fixed(report.brier, 3)} over ${plural(report.scored, 'question', 'questions')}${interval(brierInterval, 2)} — lower is better; always saying 50% scores 0.25`;
}

function skillRow(label: string, value: number | null, reading: string, reasonIfNull: string): [string, string, string] {
  return value === null ? [label, '—', reasonIfNull] : [label, fixed(value, 2, true), reading];
}

function scorecard(ctx: Context): string {
  const { report } = ctx.input;
  const n = report.scored;
  if (n === 0 || report.brier === null) {
    return `<section id="scorecard"><h2>Scorecard</h2>
<p class="headline" id="headline-brier">Nothing scored yet: no question here has been resolved Yes or No with a forecast made before its window ended.</p></section>`;
  }
  const nothing = 'nothing scored yet';
  const cal = report.calibration;
  const calibration: [string, string, string] =
    cal.slope !== null && cal.intercept !== null
      ? [
          'Calibration slope / intercept',
          `${fixed(cal.slope, 2)} / ${fixed(cal.intercept, 2)}`,
          `${cal.slope < 1 ? 'slope below 1: calls were too extreme' : cal.slope > 1 ? 'slope above 1: calls were too timid' : 'slope 1: neither too extreme nor too timid'}; a stated ${wholePercent(READING_P)} behaved like ${wholePercent(recalibrate(READING_P, cal.intercept, cal.slope))}`,
        ]
      : ['Calibration slope / intercept', '—', cal.reason ?? 'not reported'];
  const skill = report.skill;
  const rows: [string, string, string][] = [
    ['Brier (final forecast)', fixed(report.brier, 3), `n = ${n}${interval(ctx.brierInterval, 2)}; 0 is perfect, always 50% scores 0.25`],
    [
      'Brier (time-averaged)',
      report.brier_time_avg === null ? '—' : fixed(report.brier_time_avg, 3),
      report.brier_time_avg === null ? nothing : `n = ${n}; the standing forecast's error averaged over each window`,
    ],
    [
      'Log score',
      report.log_score === null ? '—' : fixed(report.log_score, 3),
      report.log_score === null ? nothing : `n = ${n}${interval(ctx.logInterval, 2)}; lower is better, always 50% scores 0.693`,
    ],
    calibration,
    report.auc === null
      ? ['ROC AUC', '—', 'needs both Yes and No outcomes']
      : ['ROC AUC', fixed(report.auc, 2), 'how often a Yes question had a higher final forecast than a No question; 0.5 is a coin toss'],
    skillRow(
      'Skill vs stated base rate',
      skill.vs_base_rate,
      `over the ${plural(ctx.withBaseRate, 'question', 'questions')} with one; 1 perfect, 0 no better, below 0 worse`,
      ctx.withBaseRate === 0 ? 'no stated base rates' : 'the base rates alone were perfect',
    ),
    skillRow('Skill vs always 50%', skill.vs_even, 'against saying 50% every time', nothing),
    skillRow('Skill vs never revising', skill.vs_first, 'against keeping the first number; above 0: revising helped', 'the first numbers were already perfect'),
    skillRow(
      'Skill vs reference forecasts',
      skill.vs_reference,
      `over the ${plural(ctx.withReference, 'question', 'questions')} with one, both time-averaged`,
      ctx.withReference === 0 ? 'no reference forecasts' : 'the reference forecasts were perfect',
    ),
  ];
  const body = rows
    .map(([label, value, reading]) => `<tr><th scope="row">${escapeHtml(label)}</th><td class="figure num">${value}</td><td class="reading">${escapeHtml(reading)}</td></tr>`)
    .join('\n');
  return `<section id="scorecard"><h2>Scorecard</h2>
<p class="headline" id="headline-brier">${escapeHtml(brierHeadline(report, ctx.brierInterval)!)}</p>
<table class="figures"><caption>Every figure over the ${plural(n, 'scored question', 'scored questions')} of this briefing</caption>
<thead><tr><th scope="col">Figure</th><th scope="col" class="num">Value</th><th scope="col">Plain reading</th></tr></thead>
<tbody>
${body}
</tbody></table></section>`;
}

/** Range of forecasts bin k holds (SCORING.md "Bins": edges (2k − 1)/20). */
function binRange(index: number): string {
  const low = Math.max(0, index * 10 - 5);
  const high = Math.min(100, index * 10 + 5);
  return `${low}–${high}%`;
}

// Plot geometry in SVG user units: a square plot with room for tick labels and axis titles;
// tick labels sit a point's largest radius away from the frame so points on 0 % never cover them.
const MAX_RADIUS = 15;
const PLOT = { left: 72, top: 18, size: 300, right: 20, bottom: 64 };
const TICKS = [0, 0.2, 0.4, 0.6, 0.8, 1];

function calibrationSvg(bins: readonly ReportBin[], n: number): string {
  const { left, top, size } = PLOT;
  const width = left + size + PLOT.right;
  const height = top + size + PLOT.bottom;
  const x = (p: number) => (left + p * size).toFixed(2);
  const y = (p: number) => (top + (1 - p) * size).toFixed(2);
  const parts: string[] = [];
  for (const t of TICKS) {
    parts.push(`<line class="cal-grid" x1="${x(t)}" y1="${y(0)}" x2="${x(t)}" y2="${y(1)}"/>`);
    parts.push(`<line class="cal-grid" x1="${x(0)}" y1="${y(t)}" x2="${x(1)}" y2="${y(t)}"/>`);
    parts.push(`<text class="cal-tick" x="${x(t)}" y="${(top + size + MAX_RADIUS + 14).toFixed(2)}" text-anchor="middle">${wholePercent(t)}</text>`);
    parts.push(`<text class="cal-tick" x="${(left - MAX_RADIUS - 3).toFixed(2)}" y="${y(t)}" text-anchor="end" dominant-baseline="middle">${wholePercent(t)}</text>`);
  }
  parts.push(`<rect class="cal-frame" x="${left}" y="${top}" width="${size}" height="${size}"/>`);
  parts.push(`<line class="cal-diagonal" x1="${x(0)}" y1="${y(0)}" x2="${x(1)}" y2="${y(1)}"/>`);
  parts.push(`<text class="cal-axis" x="${x(0.5)}" y="${(top + size + MAX_RADIUS + 40).toFixed(2)}" text-anchor="middle">Said (mean final forecast in the bin)</text>`);
  parts.push(
    `<text class="cal-axis" x="${-(top + size / 2)}" y="16" text-anchor="middle" transform="rotate(-90)">Came true (share of questions resolved Yes)</text>`,
  );
  // Point area ∝ n: radius ∝ √n, the largest bin at MAX_RADIUS.
  const largest = Math.max(1, ...bins.map((b) => b.n));
  for (const b of bins) {
    parts.push(`<line class="cal-bar" x1="${x(b.mean_p)}" y1="${y(b.wilson_low)}" x2="${x(b.mean_p)}" y2="${y(b.wilson_high)}"/>`);
    for (const end of [b.wilson_low, b.wilson_high]) {
      parts.push(`<line class="cal-bar" x1="${(left + b.mean_p * size - 4).toFixed(2)}" y1="${y(end)}" x2="${(left + b.mean_p * size + 4).toFixed(2)}" y2="${y(end)}"/>`);
    }
  }
  for (const b of bins) {
    const r = (MAX_RADIUS * Math.sqrt(b.n / largest)).toFixed(2);
    parts.push(
      `<circle class="cal-point" cx="${x(b.mean_p)}" cy="${y(b.observed)}" r="${r}"><title>Said ${wholePercent(b.mean_p)} on ${plural(b.n, 'question', 'questions')}; ${wholePercent(b.observed)} came true (95% interval ${wholePercent(b.wilson_low)}–${wholePercent(b.wilson_high)})</title></circle>`,
    );
  }
  if (bins.length === 0) {
    parts.push(`<text class="cal-empty" x="${x(0.5)}" y="${y(0.5)}" text-anchor="middle">No scored questions yet</text>`);
  }
  const desc =
    bins.length === 0
      ? 'No scored questions yet, so there are no points.'
      : `Final forecasts of ${plural(n, 'scored question', 'scored questions')} grouped into ${plural(bins.length, 'bin', 'bins')}. ` +
        'Each point is placed at the mean forecast of its bin (across) and the share that came true (up), with its 95% Wilson interval as a vertical bar; ' +
        'its area is proportional to the number of questions. Points on the dashed diagonal came true exactly as often as stated. The same figures are in the table below.';
  return `<svg role="img" aria-labelledby="cal-title cal-desc" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}">
<title id="cal-title">Calibration diagram: what was said against what came true</title>
<desc id="cal-desc">${escapeHtml(desc)}</desc>
${parts.join('\n')}
</svg>`;
}

function calibration(ctx: Context): string {
  const { bins, scored } = ctx.input.report;
  const rows = bins
    .map(
      (b) =>
        `<tr><td>${binRange(b.index)}</td><td class="num">${b.n}</td><td class="num">${wholePercent(b.mean_p)}</td><td class="num">${wholePercent(b.observed)}</td><td class="num">${wholePercent(b.wilson_low)}–${wholePercent(b.wilson_high)}</td></tr>`,
    )
    .join('\n');
  const table =
    bins.length === 0
      ? '<p class="muted">No scored questions yet, so no bins.</p>'
      : `<table class="bins" id="calibration-table"><caption>The points of the diagram: final forecasts by bin, with the 95% Wilson interval of what came true</caption>
<thead><tr><th scope="col">Bin</th><th scope="col" class="num">n</th><th scope="col" class="num">Said</th><th scope="col" class="num">Came true</th><th scope="col" class="num">95% interval</th></tr></thead>
<tbody>
${rows}
</tbody></table>`;
  return `<section id="calibration"><h2>Calibration</h2>
<div class="calibration-block">
<figure>${calibrationSvg(bins, scored)}
<figcaption>Dashed line: came true exactly as often as said. Bars: 95% Wilson intervals; wide bars mean few questions.</figcaption></figure>
</div>
${table}
</section>`;
}

function entry(call: ConfidentCall, kind: 'miss' | 'hit', timeZone: string): string {
  const { row, question: q } = call;
  const when = dateFormat(timeZone, 'entry');
  // The forecasts that count (SCORING.md): at or before T, in time order, same time → entry order.
  const counting = q.forecasts
    .map((f) => ({ f, at: instant(f.at, `question ${q.id} forecast time`) }))
    .filter(({ at }) => at <= row.T)
    .sort((a, b) => a.at - b.at || a.f.seq - b.f.seq);
  const late = q.forecasts.length - counting.length;
  const path = counting
    .map(
      ({ f, at }) =>
        `<tr><td class="date">${escapeHtml(when.format(at))}</td><td class="num">${wholePercent(f.p)}</td><td class="note">${f.note.trim() ? escapeHtml(f.note) : '<span class="muted">no note</span>'}</td></tr>`,
    )
    .join('\n');
  const resolution = q.resolution!;
  const outcome = row.outcome === 'yes' ? 'Yes' : 'No';
  const base =
    q.base_rate === null
      ? ''
      : `<p><span class="label">Base rate</span>${wholePercent(q.base_rate)}${q.base_rate_note.trim() ? ` — ${escapeHtml(q.base_rate_note)}` : ''}</p>`;
  return `<article class="entry ${kind}">
<h3>${escapeHtml(q.title)}</h3>
<p class="verdict"><span class="marker">${kind}</span><span class="said">Final forecast ${wholePercent(row.p)}</span>, resolved <span class="outcome">${outcome}</span></p>
<p class="tags">${q.tags.map(escapeHtml).join(' · ')}</p>
<p><span class="label">Rule</span><span class="note">${q.rule.trim() ? escapeHtml(q.rule) : '<span class="muted">no rule written</span>'}</span></p>
${base}
<table class="path"><caption>Forecast path: every revision that counts, with the note written at the time</caption>
<thead><tr><th scope="col">When</th><th scope="col" class="num">Forecast</th><th scope="col">Note</th></tr></thead>
<tbody>
${path}
</tbody></table>
${late > 0 ? `<p class="muted">${plural(late, 'revision was', 'revisions were')} made after the window ended and ${late === 1 ? 'does' : 'do'} not count.</p>\n` : ''}<p><span class="label">Resolution</span><strong>${outcome}</strong>, ${escapeHtml(when.format(instant(resolution.at, `question ${q.id} resolution time`)))}${resolution.note.trim() ? ` — <span class="note">${escapeHtml(resolution.note)}</span>` : ''}</p>
</article>`;
}

/**
 * A section of entries. The heading, its lede and the first entry are printed as one
 * unbreakable block, so a heading is never left alone at the foot of a page.
 */
function entrySection(id: string, heading: string, lede: string, entries: string[], empty: string): string {
  const [first, ...rest] = entries;
  return `<section id="${id}">
<div class="keep"><h2>${heading}</h2>
<p class="lede">${lede}</p>
${first ?? `<p class="muted">${empty}</p>`}
</div>
${rest.join('\n')}
</section>`;
}

/** The confident calls as shown: every miss, and the most recent hits (at most MAX_CONFIDENT_HITS of `hitCount`). */
function confidentSections(ctx: Context, misses: ConfidentCall[], shown: ConfidentCall[], hitCount: number): string {
  const { threshold, time_zone } = ctx.input;
  const hi = wholePercent(threshold);
  const lo = wholePercent(Number((1 - threshold).toFixed(12)));
  const hitLede =
    hitCount > shown.length
      ? `The ${shown.length} most recent of ${hitCount}: final forecast ${hi} or more on a Yes, or ${lo} or less on a No.`
      : `Final forecast ${hi} or more on a Yes, or ${lo} or less on a No.`;
  return `${entrySection(
    'misses',
    'Confident misses',
    `Final forecast ${hi} or more on a question that resolved No, or ${lo} or less on one that resolved Yes; worst first. Void questions never count.`,
    misses.map((c) => entry(c, 'miss', time_zone)),
    `No confident misses among the ${plural(ctx.input.report.scored, 'scored question', 'scored questions')}.`,
  )}
${entrySection('hits', 'Confident hits', hitLede, shown.map((c) => entry(c, 'hit', time_zone)), 'No confident hits.')}`;
}

// ── Choice and numeric questions ────────────────────────────────────────────────────────

/** A revision's note, or a muted "no note". */
function noteCell(note: string): string {
  return note.trim() ? escapeHtml(note) : '<span class="muted">no note</span>';
}

/** Revisions made after the window end, which never count (SCORING.md "Which forecasts count"). */
function lateLine(late: number): string {
  return late > 0 ? `<p class="muted">${plural(late, 'revision was', 'revisions were')} made after the window ended and ${late === 1 ? 'does' : 'do'} not count.</p>\n` : '';
}

function resolutionLine(resolution: { at: string; note: string }, shown: string, id: string, timeZone: string): string {
  const when = dateFormat(timeZone, 'entry').format(instant(resolution.at, `question ${id} resolution time`));
  return `<p><span class="label">Resolution</span><strong>${escapeHtml(shown)}</strong>, ${escapeHtml(when)}${resolution.note.trim() ? ` — <span class="note">${escapeHtml(resolution.note)}</span>` : ''}</p>`;
}

/** A choice forecast as each option's label with its percentage, in option order. */
function optionShares(options: readonly string[], probs: readonly number[]): string {
  return options.map((label, k) => `${escapeHtml(label)} ${wholePercent(probs[k]!)}`).join(' · ');
}

function choiceEntry(e: ChoiceHindsightEntry, timeZone: string): string {
  const when = dateFormat(timeZone, 'entry');
  const counting = e.forecasts.filter((f) => f.counted);
  const path = counting
    .map((f) => `<tr><td class="date">${escapeHtml(when.format(instant(f.at, `question ${e.id} forecast time`)))}</td><td class="shares">${optionShares(e.options, f.probs)}</td><td class="note">${noteCell(f.note)}</td></tr>`)
    .join('\n');
  const top = e.options[e.top_option]!;
  const happened = e.options[e.outcome_option]!;
  const base =
    e.option_base_rates === null
      ? ''
      : `<p><span class="label">Option base rates</span>${optionShares(e.options, e.option_base_rates)}${e.base_rate_note.trim() ? ` — ${escapeHtml(e.base_rate_note)}` : ''}</p>\n`;
  return `<article class="entry miss">
<h3>${escapeHtml(e.title)}</h3>
<p class="verdict"><span class="marker">miss</span><span class="said">Top choice “${escapeHtml(top)}” at ${wholePercent(e.top_p)}</span>; what came true: <span class="outcome">${escapeHtml(happened)}</span>, given ${wholePercent(e.outcome_p)}</p>
<p class="tags">${e.tags.map(escapeHtml).join(' · ')}</p>
<p><span class="label">Rule</span><span class="note">${e.rule.trim() ? escapeHtml(e.rule) : '<span class="muted">no rule written</span>'}</span></p>
${base}<table class="path"><caption>Forecast path: every revision that counts, with the note written at the time</caption>
<thead><tr><th scope="col">When</th><th scope="col">Forecast</th><th scope="col">Note</th></tr></thead>
<tbody>
${path}
</tbody></table>
${lateLine(e.forecasts.length - counting.length)}${resolutionLine(e.resolution, happened, e.id, timeZone)}
</article>`;
}

// Made on first use, not at load: the first Intl object of a process costs every start of
// the command line ~20 ms, and most commands never write a briefing.
let numberFormat: Intl.NumberFormat | undefined;
let dateValueFormat: Intl.DateTimeFormat | undefined;
const formatNumber = (x: number): string => (numberFormat ??= new Intl.NumberFormat(LOCALE, { maximumFractionDigits: 4 })).format(x);
const formatDateValue = (ms: number): string =>
  (dateValueFormat ??= new Intl.DateTimeFormat(LOCALE, { timeZone: 'UTC', day: 'numeric', month: 'short', year: 'numeric' })).format(ms);

/** A numeric question's value as the reader sees it: a number with its unit, or a calendar date. */
function shownValue(q: { value_kind: ValueKind; unit: string }, value: NumericValue): string {
  if (q.value_kind === 'date') return formatDateValue(Date.parse(`${String(value)}T00:00:00Z`));
  const n = formatNumber(value as number);
  return q.unit ? `${n} ${q.unit}` : n;
}

/** A range of a numeric question: "12–21 weeks", or two dates "1 Mar 2026 – 20 Mar 2026". */
function shownRange(q: { value_kind: ValueKind; unit: string }, low: NumericValue, high: NumericValue): string {
  if (q.value_kind === 'date') return `${shownValue(q, low)} – ${shownValue(q, high)}`;
  const span = `${formatNumber(low as number)}–${formatNumber(high as number)}`;
  return q.unit ? `${span} ${q.unit}` : span;
}

/** A forecast's values in level order: "10 / 14 / 20 weeks", or dates each in full. */
function shownValues(q: { value_kind: ValueKind; unit: string }, values: readonly NumericValue[]): string {
  if (q.value_kind === 'date') return values.map((x) => shownValue(q, x)).join(' / ');
  const list = values.map((x) => formatNumber(x as number)).join(' / ');
  return q.unit ? `${list} ${q.unit}` : list;
}

/** How far outside the range, in the question's unit: days for a date. */
function shownDistance(e: NumericHindsightEntry): string {
  const n = formatNumber(e.distance);
  if (e.value_kind === 'date') return `${n} ${e.distance === 1 ? 'day' : 'days'} ${e.side === 'below' ? 'before' : 'after'} it`;
  return `${e.unit ? `${n} ${e.unit}` : n} ${e.side} it`;
}

function numericEntry(e: NumericHindsightEntry, timeZone: string): string {
  const when = dateFormat(timeZone, 'entry');
  const counting = e.forecasts.filter((f) => f.counted);
  const levels = e.levels.map((l) => `P${Math.round(l * 100)}`).join(' / ');
  const path = counting
    .map((f) => `<tr><td class="date">${escapeHtml(when.format(instant(f.at, `question ${e.id} forecast time`)))}</td><td class="values">${escapeHtml(shownValues(e, f.quantiles))}</td><td class="note">${noteCell(f.note)}</td></tr>`)
    .join('\n');
  const size = e.size === null ? 'a range of zero width' : `${fixed(e.size, 2)} × the range's width`;
  return `<article class="entry miss">
<h3>${escapeHtml(e.title)}</h3>
<p class="verdict"><span class="marker">surprise</span><span class="said">${wholePercent(e.level)} range ${escapeHtml(shownRange(e, e.low, e.high))}</span>; the outcome <span class="outcome">${escapeHtml(shownValue(e, e.value))}</span> was ${escapeHtml(shownDistance(e))} (${escapeHtml(size)})</p>
<p class="tags">${e.tags.map(escapeHtml).join(' · ')}</p>
<p><span class="label">Rule</span><span class="note">${e.rule.trim() ? escapeHtml(e.rule) : '<span class="muted">no rule written</span>'}</span></p>
<table class="path"><caption>Forecast path: every revision that counts (${escapeHtml(levels)}), with the note written at the time</caption>
<thead><tr><th scope="col">When</th><th scope="col">${escapeHtml(levels)}</th><th scope="col">Note</th></tr></thead>
<tbody>
${path}
</tbody></table>
${lateLine(e.forecasts.length - counting.length)}${resolutionLine(e.resolution, shownValue(e, e.value), e.id, timeZone)}
</article>`;
}

/** The choice misses and the numeric surprises; a section only when the briefing has such entries. */
function typedSections(ctx: Context): string {
  const { choice_misses, numeric_surprises, threshold, time_zone } = ctx.input;
  const parts: string[] = [];
  if (choice_misses.length) {
    parts.push(
      entrySection(
        'choice-misses',
        'Choice questions: confident misses',
        `The top choice held at ${wholePercent(threshold)} or more, and another option came true; the most confident first.`,
        choice_misses.map((e) => choiceEntry(e, time_zone)),
        '',
      ),
    );
  }
  if (numeric_surprises.length) {
    parts.push(
      entrySection(
        'surprises',
        'Numeric questions: surprises',
        "The outcome fell outside the widest range of the final forecast; the largest first, measured as the distance outside divided by the range's width.",
        numeric_surprises.map((e) => numericEntry(e, time_zone)),
        '',
      ),
    );
  }
  return parts.join('\n');
}

/**
 * The question's standing number, compact: the latest forecast entered (same time →
 * entered last) as a percentage, a choice question's top option with its percentage, or
 * a numeric question's widest range.
 */
function lastForecastText(q: Question): string {
  let last: Question['forecasts'][number] | null = null;
  let lastAt = -Infinity;
  for (const f of q.forecasts) {
    const at = instant(f.at, `question ${q.id} forecast time`);
    if (last === null || at > lastAt || (at === lastAt && f.seq > last.seq)) {
      last = f;
      lastAt = at;
    }
  }
  if (last === null) return '—';
  if (q.type === 'binary') return wholePercent((last as BinaryQuestion['forecasts'][number]).p);
  if (q.type === 'choice') {
    const probs = (last as { probs: number[] }).probs;
    // The top choice: the highest probability, ties to the option listed first (SCORING.md).
    let top = 0;
    for (let k = 1; k < probs.length; k++) if (probs[k]! > probs[top]!) top = k;
    return `${escapeHtml(q.options[top]!)} ${wholePercent(probs[top]!)}`;
  }
  const values = (last as { quantiles: NumericValue[] }).quantiles;
  if (values.length === 1) return escapeHtml(shownValue(q, values[0]!));
  const range = `P${Math.round(q.levels[0]! * 100)}–P${Math.round(q.levels[q.levels.length - 1]! * 100)}`;
  return `${range} ${escapeHtml(shownRange(q, values[0]!, values[values.length - 1]!))}`;
}

function openQuestions(ctx: Context): string {
  const open = ctx.input.open
    .map((q) => ({ q, closes: instant(q.closes_at, `question ${q.id} closes_at`) }))
    .sort((a, b) => a.closes - b.closes || (a.q.title < b.q.title ? -1 : a.q.title > b.q.title ? 1 : 0));
  if (open.length === 0) return `<section id="open"><h2>Open questions</h2><p class="muted">No open questions.</p></section>`;
  const rows = open
    .map(({ q, closes }) => {
      const closed = closes <= ctx.input.generated_at ? ' <span class="muted">(closed, awaiting resolution)</span>' : '';
      const base = q.type === 'binary' && q.base_rate !== null ? wholePercent(q.base_rate) : '—';
      return `<tr><td>${escapeHtml(q.title)}</td><td>${escapeHtml(dateFormat(q.time_zone, 'close').format(closes))}${closed}</td><td class="num">${lastForecastText(q)}</td><td class="num">${base}</td></tr>`;
    })
    .join('\n');
  return `<section id="open"><h2>Open questions</h2>
<table class="open" id="open-table"><caption>Closing first at the top; each close in the question's own time zone</caption>
<thead><tr><th scope="col">Question</th><th scope="col">Closes</th><th scope="col" class="num">Last forecast</th><th scope="col" class="num">Base rate</th></tr></thead>
<tbody>
${rows}
</tbody></table></section>`;
}

// ── The document ────────────────────────────────────────────────────────────────────────

/** The document's title (also a sensible name for a downloaded copy). */
export function briefingTitle(tag: string | null): string {
  return `Forelog briefing — ${tag === null ? 'the whole diary' : tag}`;
}

/**
 * Renders the briefing as a complete HTML document.
 *
 * @param input the tag (null: the whole diary), when and in which zone it is generated,
 *   the tag's `ScoreReport` and scored yes/no questions, a way to read the confident calls
 *   in full, the tag's open questions, and the confidence threshold
 * @returns `<!doctype html>` text with one <style> element, inline SVG, no script and no
 *   external reference; every piece of user text escaped
 * @throws RangeError when the time zone is unknown, the threshold is not in [0.5, 1], or
 *   a question carries a malformed time
 */
export function renderBriefing(input: BriefingInput): string {
  if (!isValidTimeZone(input.time_zone)) {
    throw new RangeError(`renderBriefing: time zone ${JSON.stringify(input.time_zone)} is not an IANA zone this system knows; pass one such as "Europe/London".`);
  }
  if (!(typeof input.threshold === 'number' && input.threshold >= 0.5 && input.threshold <= 1)) {
    throw new RangeError(`renderBriefing: threshold is ${String(input.threshold)}; give a probability from 0.5 to 1, such as 0.8.`);
  }
  if (!Number.isFinite(input.generated_at)) {
    throw new RangeError(`renderBriefing: generated_at is ${String(input.generated_at)}; pass the time in epoch milliseconds.`);
  }
  const tag = input.tag;
  // The scorecard, calibration and confident calls are yes/no questions'; the open table lists every type.
  const { detail, questions: scoring } = input.scored;
  const scoringById = new Map(scoring.map((q) => [q.id, q]));
  let withBaseRate = 0;
  let withReference = 0;
  for (const row of detail.per_question) {
    const q = scoringById.get(row.id)!;
    if (q.base_rate !== null) withBaseRate++;
    if (q.references.some((r) => r.at <= windowEnd(q))) withReference++;
  }
  const subject = tag === null ? 'the whole diary' : tag;
  const ctx: Context = {
    input,
    subject,
    brierInterval: detail.brier_interval,
    logInterval: detail.log_interval,
    withBaseRate,
    withReference,
  };
  // Only the calls shown are read in full.
  const { misses, hits } = confidentRows(detail.per_question, input.threshold);
  const shownHits = hits.slice(0, MAX_CONFIDENT_HITS);
  const full = new Map(input.details([...misses, ...shownHits].map((row) => row.id)).map((q) => [q.id, q]));
  const call = (row: ScoredQuestionRow): ConfidentCall => ({ row, question: full.get(row.id)! });
  const typed = typedSections(ctx);
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="color-scheme" content="light">
<title>${escapeHtml(briefingTitle(tag))}</title>
<style>${BRIEFING_CSS}</style>
</head>
<body>
<main class="sheet">
${header(ctx)}
${scorecard(ctx)}
${calibration(ctx)}
${confidentSections(ctx, misses.map(call), shownHits.map(call), hits.length)}
${typed ? `${typed}\n` : ''}${openQuestions(ctx)}
<footer>Forelog briefing for ${escapeHtml(subject)}, made from the diary on this computer. Figures as defined in Forelog's scoring notes; dates in ${escapeHtml(input.time_zone)} unless marked. Scores describe past calls, not future ones.</footer>
</main>
</body>
</html>
`;
}
