/**
 * The example diary (main/service/demo.ts) against the diary-file contract (INTERFACES.md
 * §1, via parseDiaryFile) and against what PRODUCT.md asks of it: an invented scenario
 * that always looks current, with a record that reads like a real, imperfect forecaster.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { buildDemoDiary, type DemoQuestion, type DiaryFileObject, type DiaryFileQuestion } from '../../main/service/demo';
import { parseDiaryFile } from '../../shared/diary-file';
import { computeChoiceReport, computeNumericReport, computeScoreReport } from '../../shared/scoring';
import type { ScoringChoiceQuestion, ScoringNumericQuestion, ScoringQuestion } from '../../shared/scoring';
import type { DiaryFileChoiceQuestion, DiaryFileNumericQuestion } from '../../main/service/demo-types';

const DAY = 86_400_000;
const NOW = Date.parse('2026-05-14T10:17:00Z');

/**
 * Instants to build the demo at: ordinary days at awkward hours, plus the minutes around
 * the clock changes of every zone the demo uses (EU rule: last Sunday of March/October at
 * 01:00 UTC; US rule: second Sunday of March / first Sunday of November at 02:00 local;
 * New South Wales: first Sunday of April / first Sunday of October at 02:00/03:00 local;
 * recalled from memory, and only used to pick test instants).
 */
const NOWS: number[] = [
  NOW,
  Date.parse('2026-01-01T00:00:30Z'),
  Date.parse('2026-03-29T00:59:00Z'),
  Date.parse('2026-03-29T01:01:00Z'),
  Date.parse('2026-10-25T00:30:00Z'),
  Date.parse('2026-10-25T23:59:00Z'),
  Date.parse('2026-03-08T06:59:00Z'),
  Date.parse('2026-11-01T05:30:00Z'),
  Date.parse('2026-04-04T15:30:00Z'),
  Date.parse('2026-10-03T16:30:00Z'),
  Date.parse('2028-02-29T23:45:00Z'),
  ...Array.from({ length: 16 }, (_, i) => Date.parse('2027-01-03T00:00:00Z') + i * (23 * DAY + 3_700_000)),
];

const ms = (iso: string) => Date.parse(iso);

/** The yes/no questions (the file writes no `type` for them). */
function yesNo(d: DiaryFileObject): DiaryFileQuestion[] {
  return d.questions.filter((q: DemoQuestion): q is DiaryFileQuestion => !('type' in q));
}

function windowEnd(q: DemoQuestion): number {
  return q.resolution ? Math.min(ms(q.closes_at), ms(q.resolution.at)) : ms(q.closes_at);
}

/** The latest forecast at or before the window end (SCORING.md "Which forecasts count"). */
function finalForecast(q: DiaryFileQuestion): number {
  const T = windowEnd(q);
  const counting = q.forecasts.filter((f) => ms(f.at) <= T).sort((a, b) => ms(a.at) - ms(b.at));
  return counting[counting.length - 1]!.p;
}

function toScoring(d: DiaryFileObject): ScoringQuestion[] {
  return yesNo(d).map((q) => ({
    id: q.id,
    title: q.title,
    tags: q.tags,
    kind: q.kind,
    closes_at: ms(q.closes_at),
    resolution: q.resolution ? { outcome: q.resolution.outcome, at: ms(q.resolution.at) } : null,
    base_rate: q.base_rate ?? null,
    costs: q.costs ?? null,
    forecasts: q.forecasts.map((f, seq) => ({ at: ms(f.at), p: f.p, seq })),
    references: q.references.map((r) => ({ at: ms(r.at), p: r.p })),
  }));
}

test('the demo is a valid diary file (INTERFACES.md §1) at many instants, including clock changes', () => {
  for (const now of NOWS) {
    const parsed = parseDiaryFile(JSON.parse(JSON.stringify(buildDemoDiary(now))));
    assert.ok(parsed.questions.length >= 24, `only ${parsed.questions.length} questions at ${new Date(now).toISOString()}`);
    assert.equal(parsed.settings?.time_zone, 'Europe/London');
  }
});

test('every time is ISO 8601 UTC with Z', () => {
  const d = buildDemoDiary(NOW);
  const iso = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/;
  for (const q of d.questions) {
    const times = [q.opened_at, q.closes_at, ...q.forecasts.map((f) => f.at), ...q.references.map((r) => r.at)];
    if (q.resolution) times.push(q.resolution.at);
    for (const t of times) assert.match(t, iso, `${q.id}: ${t}`);
  }
});

test('the same now gives the same diary; a later now moves it along', () => {
  assert.deepEqual(buildDemoDiary(NOW), buildDemoDiary(NOW));
  const later = buildDemoDiary(NOW + 30 * DAY);
  const first = buildDemoDiary(NOW);
  // Same London wall clock 30 days on (no clock change between these two dates): every
  // time moves by exactly 30 days. Derived from the day-offset construction.
  const shift = (iso: string) => new Date(ms(iso) + 30 * DAY).toISOString();
  const q0 = first.questions[0]!;
  const l0 = later.questions[0]!;
  assert.equal(l0.opened_at, shift(q0.opened_at));
  assert.equal(l0.forecasts[1]!.at, shift(q0.forecasts[1]!.at));
});

test('the record spans at least 15 months before now and mixes both kinds', () => {
  const d = buildDemoDiary(NOW);
  const earliest = Math.min(...d.questions.map((q) => ms(q.opened_at)));
  const fifteenMonthsAgo = new Date(NOW);
  fifteenMonthsAgo.setUTCMonth(fifteenMonthsAgo.getUTCMonth() - 15);
  assert.ok(earliest <= fifteenMonthsAgo.getTime(), `earliest opening ${new Date(earliest).toISOString()}`);
  const events = d.questions.filter((q) => q.kind === 'event_by_deadline').length;
  const states = d.questions.filter((q) => q.kind === 'state_at_deadline').length;
  assert.ok(events >= 5 && states >= 5, `events ${events}, states ${states}`);
});

test('about two thirds resolved, with a couple of void questions that say why', () => {
  const d = buildDemoDiary(NOW);
  const resolved = d.questions.filter((q) => q.resolution);
  const share = resolved.length / d.questions.length;
  assert.ok(share >= 0.55 && share <= 0.75, `resolved share ${share}`);
  const voids = resolved.filter((q) => q.resolution!.outcome === 'void');
  assert.ok(voids.length >= 2 && voids.length <= 3, `void ${voids.length}`);
  for (const q of voids) assert.ok(q.resolution!.note.length > 40, `${q.id} void without a reason`);
});

test('the open questions include some closing within 4 days, some past close and some further out', () => {
  for (const now of NOWS) {
    const d = buildDemoDiary(now);
    const open = d.questions.filter((q) => !q.resolution);
    const soon = open.filter((q) => ms(q.closes_at) > now && ms(q.closes_at) <= now + 4 * DAY);
    const past = open.filter((q) => ms(q.closes_at) <= now);
    const later = open.filter((q) => ms(q.closes_at) > now + 4 * DAY);
    const at = new Date(now).toISOString();
    assert.ok(soon.length >= 2 && soon.length <= 3, `closing within 4 days at ${at}: ${soon.length}`);
    assert.ok(past.length >= 1 && past.length <= 2, `awaiting resolution at ${at}: ${past.length}`);
    assert.ok(later.length >= 3, `further out at ${at}: ${later.length}`);
  }
});

test('times are in order: opened ≤ forecasts and references ≤ window end, nothing after now', () => {
  for (const now of NOWS) {
    const d = buildDemoDiary(now);
    for (const q of d.questions) {
      const id = `${q.id} at now=${new Date(now).toISOString()}`;
      const opened = ms(q.opened_at);
      const close = ms(q.closes_at);
      assert.ok(opened < close, `${id}: opened after close`);
      assert.ok(opened <= now, `${id}: opened in the future`);
      assert.equal(ms(q.forecasts[0]!.at) >= opened, true, `${id}: first forecast before opening`);
      // Forecasts and references: within [opened, T] for resolved questions (SCORING.md
      // window end T = min(close, resolution)); before now for open ones.
      const limit = q.resolution ? windowEnd(q) : now;
      let previous = -Infinity;
      for (const f of q.forecasts) {
        const t = ms(f.at);
        assert.ok(t >= opened && t <= limit, `${id}: forecast ${f.at} outside [opened, ${new Date(limit).toISOString()}]`);
        assert.ok(t > previous, `${id}: forecasts out of order`);
        previous = t;
      }
      for (const r of q.references) {
        const t = ms(r.at);
        assert.ok(t >= opened && t <= limit, `${id}: reference ${r.at} outside the window`);
      }
      if (q.resolution) {
        const res = ms(q.resolution.at);
        assert.ok(res <= now, `${id}: resolved in the future`);
        const { outcome } = q.resolution;
        // A state is read off at the close; an event that did not happen is only known at
        // the close; an event that happened may resolve early (INTERFACES.md §1 kinds).
        if (outcome === 'no' || (outcome === 'yes' && q.kind === 'state_at_deadline')) {
          assert.ok(res >= close, `${id}: ${outcome} resolved before the close`);
        }
      }
    }
  }
});

test('each question has 1–6 revisions, a rule, and most have a base rate with its reference class', () => {
  const d = buildDemoDiary(NOW);
  for (const q of d.questions) {
    assert.ok(q.forecasts.length >= 1 && q.forecasts.length <= 6, `${q.id}: ${q.forecasts.length} revisions`);
    assert.ok(q.rule.length > 30, `${q.id}: rule too thin`);
    for (const f of q.forecasts) assert.ok(f.note.length > 0, `${q.id}: revision without a note`);
  }
  // Base rates and costs are yes/no questions' fields (INTERFACES.md "Question types").
  const binary = yesNo(d);
  const withBase = binary.filter((q) => q.base_rate !== undefined && (q.base_rate_note ?? '').length > 10);
  assert.ok(withBase.length / binary.length >= 0.75, `base rates on ${withBase.length}`);
  const withCosts = binary.filter((q) => q.costs);
  assert.ok(withCosts.length >= 5, `costs on ${withCosts.length}`);
});

test('lenses and reference forecasts from named sources appear on several questions', () => {
  const d = buildDemoDiary(NOW);
  const lensed = yesNo(d).flatMap((q) => q.forecasts).filter((f) => f.lenses && f.lenses.length > 0);
  assert.ok(lensed.length >= 4, `lenses on ${lensed.length} revisions`);
  const names = new Set(lensed.flatMap((f) => f.lenses!.map((l) => l.name)));
  assert.deepEqual([...names].sort(), ["devil's advocate", 'inside view', 'outside view']);
  const withRefs = d.questions.filter((q) => q.references.length > 0);
  assert.ok(withRefs.length >= 8, `references on ${withRefs.length} questions`);
  const sources = new Set(withRefs.flatMap((q) => q.references.map((r) => r.source)));
  for (const s of ["client's view", 'steering committee', 'sector survey']) assert.ok(sources.has(s), `no "${s}" reference`);
});

test('mostly Europe/London, with a couple of other zones', () => {
  const d = buildDemoDiary(NOW);
  const london = d.questions.filter((q) => q.time_zone === 'Europe/London').length;
  const others = new Set(d.questions.map((q) => q.time_zone).filter((z) => z !== 'Europe/London'));
  assert.ok(london / d.questions.length >= 0.8, `London on ${london}`);
  assert.deepEqual([...others].sort(), ['America/New_York', 'Australia/Sydney']);
});

test('the record reads like a real, imperfect forecaster', () => {
  const d = buildDemoDiary(NOW);
  const scored = yesNo(d).filter((q) => q.resolution && q.resolution.outcome !== 'void');
  const final = scored.map(finalForecast);
  const outcome: number[] = scored.map((q) => (q.resolution!.outcome === 'yes' ? 1 : 0));
  // Confident miss: final forecast ≥ 0.8 resolved No, or ≤ 0.2 resolved Yes (INTERFACES.md §2).
  const misses = scored.filter((_, i) => (final[i]! >= 0.8 && outcome[i] === 0) || (final[i]! <= 0.2 && outcome[i] === 1));
  assert.ok(misses.length >= 2 && misses.length <= 4, `confident misses ${misses.length}`);
  const hits = scored.filter((_, i) => (final[i]! >= 0.8 && outcome[i] === 1) || (final[i]! <= 0.2 && outcome[i] === 0));
  assert.ok(hits.length > misses.length, `confident hits ${hits.length} vs misses ${misses.length}`);

  // Brier score (Brier 1950: mean squared difference between forecast and outcome) of the
  // final forecasts beats always-50% (0.25) and the sample climatology ō(1−ō) (Murphy 1973
  // uncertainty term), but is far from perfect.
  const brier = final.reduce((s, p, i) => s + (p - outcome[i]!) ** 2, 0) / final.length;
  const obar = outcome.reduce((s, o) => s + o, 0) / outcome.length;
  assert.ok(brier < obar * (1 - obar) && brier < 0.25, `Brier ${brier}, climatology ${obar * (1 - obar)}`);
  assert.ok(brier > 0.12, `Brier ${brier} looks too good to be true`);
});

test('the scoring engine sees the same record: confident misses listed, skill above even odds', () => {
  const report = computeScoreReport(toScoring(buildDemoDiary(NOW)), { default_costs: { false_alarm: 1, miss: 1 } });
  assert.ok(report.scored >= 18, `scored ${report.scored}`);
  assert.equal(report.void, 2);
  assert.ok(report.open >= 8, `open ${report.open}`);
  assert.ok(report.confident_misses.length >= 2, `confident misses ${report.confident_misses.length}`);
  assert.ok(report.skill.vs_even !== null && report.skill.vs_even > 0, `skill vs 50% ${report.skill.vs_even}`);
  assert.ok(report.skill.vs_reference !== null, 'reference skill should be defined');
});

test('tags follow the tag rule and cover the scenario', () => {
  const d = buildDemoDiary(NOW);
  const tags = new Set(d.questions.flatMap((q) => q.tags));
  for (const t of ['client:norrowby', 'renewals', 'procurement', 'regulation', 'delivery', 'hiring', 'pricing']) {
    assert.ok(tags.has(t), `no question tagged ${t}`);
  }
  const clients = [...tags].filter((t) => t.startsWith('client:'));
  assert.ok(clients.length >= 5, `clients ${clients.join(', ')}`);
});

test('no text names a month, weekday or season, because every date moves with now', () => {
  const d = buildDemoDiary(NOW);
  const calendarWords =
    /\b(January|February|March|April|May|June|July|August|September|October|November|December|Monday|Tuesday|Wednesday|Thursday|Friday|Saturday|Sunday)\b|\b(spring|summer|autumn|winter|christmas|easter)\b/i;
  for (const q of d.questions) {
    const texts = [q.title, q.rule, 'base_rate_note' in q ? (q.base_rate_note ?? '') : '', ...q.forecasts.map((f) => f.note), q.resolution?.note ?? ''];
    if ('options' in q) texts.push(...q.options);
    for (const t of texts) {
      // "may" as a verb is fine; the month is only caught capitalised.
      const hit = calendarWords.exec(t.replace(/\bmay\b/g, ''));
      assert.equal(hit, null, `${q.id}: "${hit?.[0]}" in "${t}"`);
    }
  }
});

const choiceQuestions = (d: DiaryFileObject) => d.questions.filter((q): q is DiaryFileChoiceQuestion => 'type' in q && q.type === 'choice');
const numericQuestions = (d: DiaryFileObject) => d.questions.filter((q): q is DiaryFileNumericQuestion => 'type' in q && q.type === 'numeric');

/** A date question's values as the engine takes them: whole days since 1970-01-01 (SCORING.md "Numeric questions"). */
const days = (v: number | string) => (typeof v === 'number' ? v : Date.parse(`${v}T00:00:00Z`) / DAY);

function choiceScoring(d: DiaryFileObject): ScoringChoiceQuestion[] {
  return choiceQuestions(d).map((q) => ({
    id: q.id,
    title: q.title,
    tags: q.tags,
    closes_at: ms(q.closes_at),
    resolution: q.resolution ? { outcome: 'option', option: q.resolution.option, at: ms(q.resolution.at) } : null,
    option_count: q.options.length,
    ordered: q.ordered,
    option_base_rates: q.option_base_rates ?? null,
    forecasts: q.forecasts.map((f, seq) => ({ at: ms(f.at), probs: f.probs, seq })),
  }));
}

function numericScoring(d: DiaryFileObject): ScoringNumericQuestion[] {
  return numericQuestions(d).map((q) => ({
    id: q.id,
    title: q.title,
    tags: q.tags,
    closes_at: ms(q.closes_at),
    resolution: q.resolution ? { outcome: 'value', value: days(q.resolution.value), at: ms(q.resolution.at) } : null,
    unit: q.unit,
    value_kind: q.value_kind,
    levels: q.levels,
    forecasts: q.forecasts.map((f, seq) => ({ at: ms(f.at), quantiles: f.quantiles.map(days), seq })),
  }));
}

test('choice questions fill every choice figure: one ordered, one confident miss of the top choice, one open', () => {
  for (const now of NOWS) {
    const d = buildDemoDiary(now);
    const report = computeChoiceReport(choiceScoring(d), {});
    const at = new Date(now).toISOString();
    assert.ok(report.scored >= 3, `choice scored ${report.scored} at ${at}`);
    assert.ok(report.open >= 1, `open choice questions ${report.open} at ${at}`);
    assert.ok(report.brier !== null && report.log_score !== null, 'Brier and log score computable');
    assert.ok(report.rps_n >= 1 && report.rps !== null, 'an ordered question is scored by the RPS');
    assert.ok(report.skill.vs_uniform !== null && report.skill.vs_base_rate !== null && report.skill.vs_first !== null, JSON.stringify(report.skill));
    assert.ok(report.top_choice.n === report.scored && report.bins.length >= 3, 'top choice and option calibration drawn');
    assert.deepEqual(
      report.confident_misses.map((m) => m.id),
      ['demo-wendlebrook-data-platform'],
    );
  }
});

test('numeric questions fill every numeric figure: a wide miss of a range, a date question, two level sets, one open', () => {
  for (const now of NOWS) {
    const d = buildDemoDiary(now);
    const report = computeNumericReport(numericScoring(d), {});
    const at = new Date(now).toISOString();
    assert.ok(report.scored >= 4, `numeric scored ${report.scored} at ${at}`);
    assert.ok(report.open >= 1, `open numeric questions ${report.open} at ${at}`);
    const eighty = report.coverage.find((c) => c.level === 0.8);
    assert.ok(eighty && eighty.n >= 3, `80 % ranges: ${JSON.stringify(eighty)}`);
    assert.ok(report.coverage.some((c) => c.level === 0.9), 'a 90 % range from the five-level question');
    assert.ok(report.landed.length >= 2, 'where outcomes landed, for two level sets');
    assert.ok(report.quantile_calibration.length >= 5, 'quantile calibration over the levels');
    assert.ok(report.relative_wis_vs_first !== null, 'revising helped? is computable');
    for (const q of report.questions) assert.ok(Number.isFinite(q.wis), `${q.id}: WIS ${q.wis}`);
    // The wide miss: 29 weeks against a final 80 % range of 12–21, (29 − 21) / 9 outside it.
    const wide = report.surprises.find((s) => s.id === 'demo-norrowby-routing-weeks');
    assert.ok(wide && wide.size !== null && wide.size > 0.5, JSON.stringify(report.surprises));
    const dated = numericQuestions(d).filter((q) => q.value_kind === 'date');
    assert.ok(dated.some((q) => q.resolution) && dated.some((q) => !q.resolution), 'a resolved and an open date question');
  }
});

test('date values are calendar dates that move with now', () => {
  const date = numericQuestions(buildDemoDiary(NOW)).find((q) => q.id === 'demo-wendlebrook-business-case-date')!;
  const later = numericQuestions(buildDemoDiary(NOW + 30 * DAY)).find((q) => q.id === date.id)!;
  for (const v of [...date.forecasts.flatMap((f) => f.quantiles), date.resolution!.value]) assert.match(String(v), /^\d{4}-\d{2}-\d{2}$/);
  assert.equal(days(later.resolution!.value) - days(date.resolution!.value), 30);
});
