/**
 * The Briefing (PRODUCT.md "Hindsight review and briefing") rendered from a real diary
 * file holding the example diary, checked as text and as a page in Debian's Chromium:
 * the figures match the scorecard, the confident calls follow SCORING.md's counting rules
 * and INTERFACES.md §2's threshold, user text is shown as text, and the document stays
 * self-contained under a strict Content-Security-Policy and prints to PDF.
 */
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Locator, type Page } from '@playwright/test';
import { briefingSources, briefingTitle, renderBriefing, wholePercent, escapeHtml, type BriefingInput } from '../../main/service/briefing';
import { BRIEFING_STYLE_HASH } from '../../main/service/briefing-style';
import { buildDemoDiary } from '../../main/service/demo';
import { CONTENT_SECURITY_POLICY } from '../../main/shell/csp';
import { isBinary, type BinaryQuestion, type Question } from '../../shared/domain';
import type { ScoreReport, ScorecardDetail } from '../../shared/scoring';
import { openTestDiary, type TestDiary } from '../support/temp-diary';

const NOW = '2026-05-14T10:17:00Z';
const CHROMIUM = process.env.FORELOG_CHROMIUM ?? '/usr/bin/chromium';
const ARTIFACTS = path.join(process.cwd(), 'test/e2e/artifacts');
/** INTERFACES.md §2: confident = final forecast ≥ 0.8 on a No, or ≤ 0.2 on a Yes. */
const THRESHOLD = 0.8;

let browser: Browser;
let context: BrowserContext;
before(async () => {
  browser = await chromium.launch({
    executablePath: CHROMIUM,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  context = await browser.newContext({ viewport: { width: 900, height: 1200 } });
});
after(() => browser?.close());

interface Loaded {
  diary: TestDiary;
  report: ScoreReport;
  detail: ScorecardDetail;
  questions: BinaryQuestion[];
}

async function load(diary: TestDiary, tag: string | null): Promise<Loaded> {
  const { report, detail } = await diary.call('score', tag === null ? {} : { tag });
  const list = await diary.call('listQuestions', tag === null ? {} : { tag });
  const questions: BinaryQuestion[] = [];
  for (const q of list.questions) {
    const question = await diary.call('getQuestion', { id: q.id });
    if (isBinary(question)) questions.push(question);
  }
  return { diary, report, detail, questions };
}

async function demo(tag: string | null): Promise<Loaded> {
  const diary = openTestDiary({ now: NOW, timeZone: 'Europe/London' });
  await diary.call('importDiary', { diary: buildDemoDiary(diary.clock.now) });
  return load(diary, tag);
}

function input(loaded: Loaded, tag: string | null, extra: Partial<BriefingInput> = {}): BriefingInput {
  return {
    tag,
    generated_at: loaded.diary.clock.now,
    time_zone: 'Europe/London',
    report: loaded.report,
    ...briefingSources(loaded.questions, tag),
    threshold: THRESHOLD,
    choice_misses: [],
    numeric_surprises: [],
    ...extra,
  };
}

/** HTML escaping of text content (HTML Living Standard, "escaping a string"), plus the two quotes. */
function escaped(text: string): string {
  return text.replaceAll('&', '&amp;').replaceAll('<', '&lt;').replaceAll('>', '&gt;').replaceAll('"', '&quot;').replaceAll("'", '&#39;');
}

/** Window end T = min(close, resolution time) and the counting forecasts (SCORING.md "Which forecasts count"). */
function counting(q: BinaryQuestion) {
  const T = Math.min(Date.parse(q.closes_at), Date.parse(q.resolution!.at));
  return q.forecasts.filter((f) => Date.parse(f.at) <= T).sort((a, b) => Date.parse(a.at) - Date.parse(b.at) || a.seq - b.seq);
}

async function show(html: string): Promise<Page> {
  const page = await context.newPage();
  await page.setContent(html);
  return page;
}

const text = (page: Page, selector: string) => page.locator(selector).innerText();

// The page's DOM, typed just enough for these checks: this project's Node lib has no DOM types.
interface DomCell {
  textContent: string | null;
}
interface DomRow {
  querySelectorAll(selector: string): Iterable<DomCell> & ArrayLike<DomCell>;
}
type StyleWindow = { getComputedStyle(element: unknown): { borderBottomColor: string } };

/** The trimmed text of every cell of the rows `selector` matches. */
function cells(page: Page, selector: string): Promise<string[][]> {
  return page
    .locator(selector)
    .evaluateAll((trs) => trs.map((tr) => Array.from((tr as unknown as DomRow).querySelectorAll('td'), (td) => (td.textContent ?? '').trim())));
}

/** The colour of a heading's bottom rule, as the browser computed it. */
function headingRule(heading: Locator): Promise<string> {
  return heading.evaluate((h) => (globalThis as unknown as StyleWindow).getComputedStyle(h).borderBottomColor);
}

test('the briefing for a tag: header, scorecard, calibration table and SVG, entries; screenshot and PDF', async () => {
  const loaded = await demo('delivery');
  const { report, detail, questions } = loaded;
  // The example diary's delivery tag: 10 scored, 1 void, 2 open, 3 confident misses
  // (main/service/demo.ts; the scoring engine's report is the source of these counts).
  assert.equal(report.scored, 10);
  assert.equal(report.confident_misses.length, 3);
  const html = renderBriefing(input(loaded, 'delivery'));

  assert.match(html, /^<!doctype html>\n<html lang="en">/);
  assert.match(html, /<meta charset="utf-8">/);
  assert.ok(html.includes('<title>Forelog briefing — delivery</title>'));
  assert.equal(briefingTitle(null), 'Forelog briefing — the whole diary');

  // Every confident miss with every counting note and its resolution note, as text.
  const byId = new Map(questions.map((q) => [q.id, q]));
  for (const miss of report.confident_misses) {
    const q = byId.get(miss.id)!;
    assert.ok(html.includes(escaped(q.title)), `miss title ${q.title}`);
    assert.ok(html.includes(escaped(q.rule)), `rule of ${q.id}`);
    for (const f of counting(q)) assert.ok(html.includes(escaped(f.note)), `note ${f.note}`);
    assert.ok(html.includes(escaped(q.resolution!.note)), `resolution note of ${q.id}`);
  }

  const page = await show(html);
  try {
    assert.equal(await text(page, 'h1'), 'Briefing: delivery');
    // The generated time in the given zone: 10:17 UTC on 14 May 2026 is 11:17 BST
    // (UK summer time, UTC+1, last Sunday of March to last Sunday of October; recalled from memory).
    assert.match(await page.locator('.masthead').innerText(), /Generated 14 May 2026 at 11:17 BST/);
    assert.equal(await text(page, '#counts'), `${report.scored} scored · ${report.void} void · ${report.open} open`);
    assert.equal(await text(page, '#caution'), `Scores describe past calls, not future ones. With n = ${report.scored} the intervals are wide.`);

    // Headline: Brier to 3 decimals, n, and the Scorecard's own 95% interval (detail.brier_interval).
    const [lo, hi] = detail.brier_interval!;
    assert.equal(
      await text(page, '#headline-brier'),
      `Brier ${report.brier!.toFixed(3)} over ${report.scored} questions (95% interval ${lo.toFixed(2)}–${hi.toFixed(2)}) — lower is better; always saying 50% scores 0.25`,
    );

    // Confident misses: one entry each, in the report's order (worst first).
    const missTitles = await page.locator('#misses article.entry h3').allInnerTexts();
    assert.deepEqual(missTitles, report.confident_misses.map((m) => m.title));
    // Each shows its final forecast against its outcome (whole percentages, rounded).
    const verdicts = await page.locator('#misses article.entry .verdict').allInnerTexts();
    report.confident_misses.forEach((m, i) => {
      assert.match(verdicts[i]!, new RegExp(`Final forecast ${Math.round(m.p * 100)}%, resolved ${m.outcome === 'yes' ? 'Yes' : 'No'}`));
    });
    // The path lists every counting revision of the question, no more.
    const first = byId.get(report.confident_misses[0]!.id)!;
    assert.equal(await page.locator('#misses article.entry').first().locator('table.path tbody tr').count(), counting(first).length);

    // Calibration table: one row per non-empty bin, numbers as in report.bins. Each shown
    // percentage is the value rounded to a whole number, so within half a point of it.
    const rows = await cells(page, '#calibration-table tbody tr');
    assert.equal(rows.length, report.bins.length);
    const near = (shown: string, value: number, what: string) => {
      const n = Number(shown.replace('%', ''));
      assert.ok(shown.endsWith('%') && Math.abs(n - value * 100) <= 0.5 + 1e-9, `${what}: shown ${shown}, value ${value}`);
    };
    report.bins.forEach((b, i) => {
      const [range, n, said, cameTrue, interval] = rows[i]!;
      // Bin k holds forecasts in [(2k − 1)/20, (2k + 1)/20) (SCORING.md "Bins").
      assert.equal(range, `${Math.max(0, b.index * 10 - 5)}–${Math.min(100, b.index * 10 + 5)}%`);
      assert.equal(Number(n), b.n);
      near(said!, b.mean_p, 'said');
      near(cameTrue!, b.observed, 'came true');
      const [low, high] = interval!.split('–');
      near(low!, b.wilson_low, 'Wilson low');
      near(high!, b.wilson_high, 'Wilson high');
    });

    // The SVG: one circle per non-empty bin, area ∝ n (r²/n the same for every point),
    // centres at (mean_p, observed) on 0–100 % axes; an accessible name and description.
    const circles = await page.locator('#calibration svg circle').evaluateAll((cs) =>
      cs.map((c) => ({ r: Number(c.getAttribute('r')), cx: Number(c.getAttribute('cx')), cy: Number(c.getAttribute('cy')) })),
    );
    assert.equal(circles.length, report.bins.length);
    const areaPerQuestion = circles.map((c, i) => (c.r * c.r) / report.bins[i]!.n);
    for (const a of areaPerQuestion) assert.ok(Math.abs(a - areaPerQuestion[0]!) / areaPerQuestion[0]! < 1e-3, `area ∝ n: ${areaPerQuestion.join(', ')}`);
    const [x0, x100] = [circles[0]!.cx - report.bins[0]!.mean_p * 300, circles[0]!.cx + (1 - report.bins[0]!.mean_p) * 300];
    circles.forEach((c, i) => assert.ok(Math.abs((c.cx - x0) / (x100 - x0) - report.bins[i]!.mean_p) < 1e-3, 'x is the mean forecast'));
    assert.equal(await page.locator('#calibration svg title#cal-title').count(), 1);
    assert.equal(await page.locator('#calibration svg desc#cal-desc').count(), 1);
    assert.equal(await page.locator('#calibration svg').getAttribute('role'), 'img');

    // Open questions of the tag, closing first at the top.
    const open = questions.filter((q) => q.resolution === null).sort((a, b) => Date.parse(a.closes_at) - Date.parse(b.closes_at));
    const openRows = await cells(page, '#open-table tbody tr');
    assert.equal(openRows.length, report.open);
    open.forEach((q, i) => {
      const [title, , last, base] = openRows[i]!;
      assert.equal(title, q.title);
      near(last!, q.forecasts.at(-1)!.p, 'last forecast');
      if (q.base_rate === null) assert.equal(base, '—');
      else near(base!, q.base_rate, 'base rate');
    });

    fs.mkdirSync(ARTIFACTS, { recursive: true });
    await page.screenshot({ path: path.join(ARTIFACTS, 'briefing.png'), fullPage: true });
    await page.emulateMedia({ media: 'print' });
    const pdf = await page.pdf({ preferCSSPageSize: true });
    fs.writeFileSync(path.join(ARTIFACTS, 'briefing.pdf'), pdf);
    assert.equal(pdf.subarray(0, 5).toString('latin1'), '%PDF-');
    const pages = pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g)?.length ?? 0;
    assert.ok(pages >= 1, `the PDF has ${pages} pages`);
  } finally {
    await page.close();
  }
});

test('the briefing the service makes from its scoring input is the one made from every question of the diary in full, whole and per tag', async () => {
  const diary = openTestDiary({ now: NOW, timeZone: 'Europe/London' });
  await diary.call('importDiary', { diary: buildDemoDiary(diary.clock.now) });
  const every: Question[] = [];
  for (const q of (await diary.call('listQuestions', {})).questions) every.push(await diary.call('getQuestion', { id: q.id }));
  assert.ok(every.some((q) => q.type !== 'binary' && q.resolution !== null), 'the example diary has resolved choice or numeric questions');
  for (const tag of [null, ...new Set(every.flatMap((q) => q.tags))]) {
    const filter = tag === null ? {} : { tag };
    const { html } = await diary.call('briefing', { ...filter, threshold: THRESHOLD });
    const hindsight = await diary.call('hindsight', { ...filter, threshold: THRESHOLD });
    const expected = renderBriefing({
      tag,
      generated_at: diary.clock.now,
      time_zone: 'Europe/London',
      report: hindsight.report,
      ...briefingSources(every, tag),
      threshold: THRESHOLD,
      choice_misses: hindsight.choice_entries,
      numeric_surprises: hindsight.numeric_surprises,
    });
    assert.equal(html, expected, `briefing for ${tag ?? 'the whole diary'}`);
  }
});

test('the briefing is self-contained: no script, no external reference, and a strict CSP with the style hash refuses nothing', async () => {
  const loaded = await demo(null);
  const html = renderBriefing(input(loaded, null));
  assert.doesNotMatch(html, /<script/i);
  assert.doesNotMatch(html, /https?:|\/\/[a-z]/i);
  assert.doesNotMatch(html, /\s(src|href|xlink:href|style|on[a-z]+)=/i);
  assert.doesNotMatch(html, /<(link|img|iframe|object|embed|base|form)\b|@import|url\(/i);
  assert.equal(html.match(/<style>/g)?.length, 1);

  // Served under a policy that allows nothing but this stylesheet (W3C CSP Level 3 hash
  // source): the page must load, apply its styles, and trigger no refusal and no request.
  const origin = 'http://forelog.test';
  const page = await context.newPage();
  try {
    const refusals: string[] = [];
    const requests: string[] = [];
    page.on('console', (m) => {
      if (m.text().includes('Content Security Policy')) refusals.push(m.text());
    });
    page.on('request', (r) => requests.push(r.url()));
    await page.route(`${origin}/**`, (route) =>
      route.fulfill({
        status: 200,
        headers: { 'content-type': 'text/html; charset=utf-8', 'content-security-policy': `default-src 'none'; style-src ${BRIEFING_STYLE_HASH}` },
        body: html,
      }),
    );
    await page.goto(`${origin}/briefing.html`);
    assert.deepEqual(refusals, []);
    assert.deepEqual(requests, [`${origin}/briefing.html`]);
    // The accent rule under each section heading shows the stylesheet applied.
    const border = await headingRule(page.locator('h2').first());
    assert.equal(border, 'rgb(31, 92, 110)');

    // Inside the app: a sandboxed srcdoc iframe inherits the app page's policy (HTML
    // Living Standard, "initialize the policy container" for srcdoc), so the app policy
    // blocks the stylesheet unless its style-src lists the hash — as the app's policy does.
    assert.ok(CONTENT_SECURITY_POLICY.includes(BRIEFING_STYLE_HASH), 'the app policy admits the briefing style');
    const withoutHash = CONTENT_SECURITY_POLICY.replace(` ${BRIEFING_STYLE_HASH}`, '');
    for (const [policy, styled] of [
      [withoutHash, false],
      [CONTENT_SECURITY_POLICY, true],
    ] as const) {
      await page.unroute(`${origin}/**`);
      await page.route(`${origin}/**`, (route) =>
        route.fulfill({
          status: 200,
          headers: { 'content-type': 'text/html; charset=utf-8', 'content-security-policy': policy },
          body: `<!doctype html><title>app</title><iframe sandbox="" title="Briefing" srcdoc="${escapeHtml(html)}"></iframe>`,
        }),
      );
      await page.goto(`${origin}/app.html`);
      const frame = page.frames().find((f) => f !== page.mainFrame())!;
      await frame.waitForSelector('h2');
      const colour = await headingRule(frame.locator('h2').first());
      assert.equal(colour === 'rgb(31, 92, 110)', styled, `policy ${policy}: border ${colour}`);
    }
  } finally {
    await page.close();
  }
});

test('user text is shown as text: a title with <script> and notes with markup stay inert', async () => {
  const diary = openTestDiary({ now: NOW });
  const title = `<script>alert("boom")</script> & 'quoted' <b>bold</b>`;
  const note = `<img src=x onerror="alert(1)"> it's "fine" & done`;
  const q = await diary.call('createQuestion', {
    title,
    rule: `Yes if <i>this</i> & that`,
    opened_at: '2026-01-05T09:00:00Z',
    closes_at: '2026-03-01T17:00:00Z',
    tags: ['escaping'],
    first_forecast: { p: 0.9, note, at: '2026-01-05T09:05:00Z' },
  });
  await diary.call('resolveQuestion', { id: q.id, outcome: 'no', at: '2026-03-01T18:00:00Z', note: '</td></tr></table><h1>injected</h1>' });
  const loaded = await load(diary, 'escaping');
  const html = renderBriefing(input(loaded, 'escaping', { time_zone: 'UTC' }));
  assert.doesNotMatch(html, /<script|<img|<b>|<i>|<h1>injected/);
  assert.ok(html.includes(escaped(title)));
  assert.ok(html.includes(escaped(note)));

  const page = await show(html);
  try {
    assert.equal(await page.locator('script, img, b, i').count(), 0);
    assert.equal(await page.locator('h1').count(), 1);
    assert.equal(await text(page, '#misses article.entry h3'), title);
    assert.equal(await text(page, '#misses table.path td.note'), note);
    assert.match(await text(page, '#misses article.entry'), /<\/td><\/tr><\/table><h1>injected<\/h1>/);
  } finally {
    await page.close();
  }
});

test('confident calls follow the counting rules: void never counts, 20 % on a Yes is a miss at 0.8, later revisions do not count', async () => {
  const diary = openTestDiary({ now: NOW });
  const make = async (name: string, forecasts: [string, number][], outcome: 'yes' | 'no' | 'void', resolvedAt = '2026-03-02T12:00:00Z') => {
    const q = await diary.call('createQuestion', {
      title: name,
      opened_at: '2026-01-05T09:00:00Z',
      closes_at: '2026-03-01T17:00:00Z',
      tags: ['rules'],
      first_forecast: { p: forecasts[0]![1], at: forecasts[0]![0], note: `${name}: first` },
    });
    for (const [at, p] of forecasts.slice(1)) await diary.call('addForecast', { question_id: q.id, at, p, note: `${name}: ${p}` });
    await diary.call('resolveQuestion', { id: q.id, outcome, at: resolvedAt });
  };
  // A typed 20 % on a Yes: ≤ 1 − 0.8 as written, although 1 − 0.8 is 0.19999999999999996 in binary.
  await make('Twenty on a yes', [['2026-01-06T09:00:00Z', 0.2]], 'yes');
  // 90 % then, after the close (T = close since it resolved later), 10 %: the 90 % is final.
  await make('Late revision', [['2026-01-06T09:00:00Z', 0.9], ['2026-03-01T20:00:00Z', 0.1]], 'no');
  // Resolved early: T = resolution time, so a revision between resolution and close is late.
  await make('Early resolution', [['2026-01-06T09:00:00Z', 0.85], ['2026-02-15T09:00:00Z', 0.3]], 'yes', '2026-02-10T12:00:00Z');
  // Two revisions at the same time: the one entered last stands (larger seq).
  await make('Same time', [['2026-01-06T09:00:00Z', 0.5], ['2026-02-01T09:00:00Z', 0.95], ['2026-02-01T09:00:00Z', 0.5]], 'no');
  await make('Void one', [['2026-01-06T09:00:00Z', 0.99]], 'no');
  await diary.call('resolveQuestion', { id: (await diary.call('listQuestions', { text: 'Void one' })).questions[0].id, outcome: 'void' });
  const loaded = await load(diary, 'rules');
  const html = renderBriefing(input(loaded, 'rules', { time_zone: 'UTC' }));
  const page = await show(html);
  try {
    // Derived from SCORING.md: finals are 0.2 (Yes), 0.9 (No), 0.85 (Yes), 0.5 (No).
    assert.deepEqual(await page.locator('#misses article.entry h3').allInnerTexts(), ['Late revision', 'Twenty on a yes']);
    assert.deepEqual(await page.locator('#hits article.entry h3').allInnerTexts(), ['Early resolution']);
    assert.deepEqual(loaded.report.confident_misses.map((m) => m.title).sort(), ['Late revision', 'Twenty on a yes']);
    assert.ok(!html.includes('Void one'), 'a void question appears nowhere');
    const late = page.locator('#misses article.entry').first();
    assert.equal(await late.locator('table.path tbody tr').count(), 1);
    assert.match(await late.innerText(), /1 revision was made after the window ended and does not count\./);
    const early = page.locator('#hits article.entry').first();
    assert.match(await early.locator('.verdict').innerText(), /Final forecast 85%, resolved Yes/);
    assert.equal(await early.locator('table.path tbody tr').count(), 1);
  } finally {
    await page.close();
  }
  // At 0.85 the 0.85 on a Yes is still a confident hit (≥ is inclusive), the 0.9 miss stays, the 0.2 goes.
  const stricter = renderBriefing(input(loaded, 'rules', { time_zone: 'UTC', threshold: 0.85 }));
  const strictPage = await show(stricter);
  try {
    assert.deepEqual(await strictPage.locator('#misses article.entry h3').allInnerTexts(), ['Late revision']);
    assert.deepEqual(await strictPage.locator('#hits article.entry h3').allInnerTexts(), ['Early resolution']);
  } finally {
    await strictPage.close();
  }
});

test('the whole diary: misses match the report, hits are capped and most recent first, dates follow the reader zone', async () => {
  const loaded = await demo(null);
  const html = renderBriefing(input(loaded, null, { time_zone: 'Pacific/Auckland', generated_at: Date.parse('2026-05-14T23:30:00Z') }));
  const page = await show(html);
  try {
    assert.equal(await text(page, 'h1'), 'Briefing: the whole diary');
    // 23:30 UTC on 14 May is 11:30 NZST (UTC+12, New Zealand standard time from April; recalled from memory).
    assert.match(await page.locator('.masthead').innerText(), /Generated 15 May 2026 at 11:30 GMT\+12/);
    assert.deepEqual(await page.locator('#misses article.entry h3').allInnerTexts(), loaded.report.confident_misses.map((m) => m.title));
    // Independent lists from SCORING.md: final forecast ≥ t on one side, ≤ 1 − t on the other (0.3 written out for t = 0.7).
    const scored = loaded.questions
      .filter((q) => q.resolution && q.resolution.outcome !== 'void' && counting(q).length > 0)
      .map((q) => ({ q, p: counting(q).at(-1)!.p, yes: q.resolution!.outcome === 'yes', T: Math.min(Date.parse(q.closes_at), Date.parse(q.resolution!.at)) }))
      .sort((a, b) => b.T - a.T);
    const hitsAt = (hi: number, lo: number) => scored.filter(({ p, yes }) => (yes ? p >= hi : p <= lo)).map((h) => h.q.title);
    const hits80 = hitsAt(0.8, 0.2);
    assert.ok(hits80.length <= 5, `the example diary has ${hits80.length} confident hits at 80%`);
    assert.deepEqual(await page.locator('#hits article.entry h3').allInnerTexts(), hits80);
    assert.equal(await text(page, '#hits .lede'), 'Final forecast 80% or more on a Yes, or 20% or less on a No.');

    const looser = await show(renderBriefing(input(loaded, null, { threshold: 0.7 })));
    try {
      const hits70 = hitsAt(0.7, 0.3);
      assert.ok(hits70.length > 5, `the example diary has ${hits70.length} confident hits at 70%`);
      assert.deepEqual(await looser.locator('#hits article.entry h3').allInnerTexts(), hits70.slice(0, 5));
      assert.equal(await text(looser, '#hits .lede'), `The 5 most recent of ${hits70.length}: final forecast 70% or more on a Yes, or 30% or less on a No.`);
      const misses70 = scored.filter(({ p, yes }) => (yes ? p <= 0.3 : p >= 0.7)).map((m) => m.q.title).sort();
      assert.deepEqual((await looser.locator('#misses article.entry h3').allInnerTexts()).sort(), misses70);
    } finally {
      await looser.close();
    }
  } finally {
    await page.close();
  }
});

test('an empty tag still renders: n = 0, no points, no misses', async () => {
  const diary = openTestDiary({ now: NOW });
  const loaded = await load(diary, 'nothing-here');
  const html = renderBriefing(input(loaded, 'nothing-here'));
  const page = await show(html);
  try {
    assert.equal(await text(page, '#caution'), 'Scores describe past calls, not future ones. With n = 0 the intervals are wide.');
    assert.equal(await page.locator('svg circle').count(), 0);
    assert.equal(await page.locator('#misses article.entry').count(), 0);
    assert.match(await text(page, '#headline-brier'), /^Nothing scored yet/);
  } finally {
    await page.close();
  }
});

test('bad input is refused with what to pass instead', async () => {
  const diary = openTestDiary({ now: NOW });
  const loaded = await load(diary, null);
  assert.throws(() => renderBriefing(input(loaded, null, { time_zone: 'Mars/Olympus' })), /not an IANA zone.*Europe\/London/);
  assert.throws(() => renderBriefing(input(loaded, null, { threshold: 0.4 })), /threshold is 0\.4; give a probability from 0\.5 to 1/);
});

test('percentages are whole numbers; only certainty reads as 0 % or 100 %', () => {
  // Rounding the decimal value half up (0.285 → 29); 0.285 × 100 is 28.499999999999996 in binary (IEEE 754).
  assert.equal(wholePercent(0.285), '29%');
  assert.equal(wholePercent(0.2), '20%');
  assert.equal(wholePercent(0), '0%');
  assert.equal(wholePercent(1), '100%');
  assert.equal(wholePercent(0.004), '<1%');
  assert.equal(wholePercent(0.996), '>99%');
});
