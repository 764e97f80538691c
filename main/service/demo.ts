/**
 * The example diary for first-time users (INTERFACES.md §1, `forelog demo`).
 *
 * Everything here is invented: Quillmere Advisory is a made-up nine-person consultancy,
 * its clients (Norrowby Freight, Wendlebrook Water, Tollmere Hospitals Trust, Pellbridge
 * Bank's digital unit, the Hollin Dales Food Co-operative, Halloway Cold Chain) are made
 * up too, and people appear only by role.
 *
 * Every time is given as a day offset from `now`, counted in local calendar days, so the
 * example always looks current and each entry lands at a plausible hour of the working
 * day. Because the dates move, no title or note names a month, a season or a weekday.
 * The user's own actions (opening, revising, resolving) happen in the diary's zone
 * (Europe/London); a question's close is read in the question's own zone.
 *
 * The record is written to look like a real, imperfect forecaster: a reasonably
 * calibrated majority, three confident misses with the notes written at the time, two
 * void questions, and open questions closing soon, overdue and further out. A handful of
 * choice and numeric questions (demo-types.ts) fill the Scorecard's sections for those
 * types, with a confident miss of a top choice and a wide miss of a range among them.
 */
import { DIARY_FORMAT, DIARY_VERSION } from '../../shared/diary-file';
import type { Outcome } from '../../shared/domain';
import { addCalendarDays, toIso, wallTimeAt, wallTimeToInstant, type WallTime } from '../../shared/time';
import { TYPED_ROWS, buildTypedQuestion, type DiaryFileChoiceQuestion, type DiaryFileNumericQuestion, type DiaryFileQuestionHead } from './demo-types';

/** A diary file (JSON v1) as a plain object, ready for `parseDiaryFile` or `JSON.stringify`. */
export interface DiaryFileObject {
  format: typeof DIARY_FORMAT;
  version: typeof DIARY_VERSION;
  settings: {
    default_false_alarm_cost: number;
    default_miss_cost: number;
    default_checkin_days: number;
    closing_soon_hours: number;
    overdue_after_days: number;
    time_zone: string;
    quiet_hours: { start: string; end: string } | null;
  };
  questions: DemoQuestion[];
}

/** Any question of the example diary: yes/no (no `type` field, as the file writes them), choice or numeric. */
export type DemoQuestion = DiaryFileQuestion | DiaryFileChoiceQuestion | DiaryFileNumericQuestion;

/** A yes/no question of the diary file. */
export interface DiaryFileQuestion extends DiaryFileQuestionHead {
  base_rate?: number;
  base_rate_note?: string;
  costs?: { false_alarm: number; miss: number };
  checkin_days?: number;
  forecasts: { at: string; p: number; note: string; lenses?: { name: string; p: number; weight: number }[] }[];
  references: { at: string; p: number; source: string }[];
  resolution: { outcome: Outcome; at: string; note: string } | null;
}

const DIARY_ZONE = 'Europe/London';

type LensRow = [name: 'outside view' | 'inside view' | "devil's advocate", p: number, weight: number];
/** [day offset, probability, note, lenses?]; the first revision is made on the opening day. */
type Revision = [day: number, p: number, note: string, lenses?: LensRow[]];
/** [day offset, probability, source]. */
type Reference = [day: number, p: number, source: string];

interface Row {
  id: string;
  title: string;
  rule: string;
  kind: 'event' | 'state';
  tags: string[];
  /** The question's own zone when it is not the diary's. */
  zone?: string;
  open: number;
  close: number;
  /** Local wall-clock close time in the question's zone; 17:00 unless given. */
  closeAt?: string;
  base?: [rate: number, note: string];
  costs?: [falseAlarm: number, miss: number];
  checkin?: number;
  forecasts: Revision[];
  refs?: Reference[];
  resolved?: [outcome: Outcome, day: number, note: string];
}

const OUT: LensRow[0] = 'outside view';
const IN: LensRow[0] = 'inside view';
const DEVIL: LensRow[0] = "devil's advocate";

const ROWS: Row[] = [
  // ── Norrowby Freight: the longest-running client ──────────────────────────────
  {
    id: 'demo-norrowby-phase2-sow',
    title: 'Norrowby Freight signs the phase-2 statement of work by the end of the quarter',
    rule: "Yes if a statement of work for phase 2, countersigned by Norrowby's CFO or a delegate, reaches us before the close. A verbal yes or a letter of intent does not count.",
    kind: 'event',
    tags: ['client:norrowby', 'renewals', 'procurement'],
    open: -545,
    close: -468,
    base: [0.7, '14 of 20 comparable phase-2 renewals signed by the target date; 6 slipped'],
    costs: [1, 3],
    forecasts: [
      [-545, 0.65, 'Sponsor (the operations director) wants it, but procurement has not seen the number yet. A notch under the reference class until they have.'],
      [-531, 0.55, 'Procurement asked for a rate-card breakdown by role. Usually a squeeze rather than a no, but it costs two or three weeks.'],
      [-510, 0.7, 'Revised SOW agreed in principle on the call: we dropped the second analyst and kept the scope. Legal review only.',
        [[OUT, 0.7, 1], [IN, 0.8, 1], [DEVIL, 0.5, 0.5]]],
      [-485, 0.85, 'Legal comments were cosmetic (governing law, invoice terms). Signature page is with the CFO.'],
    ],
    refs: [
      [-538, 0.9, "client's view"],
      [-500, 0.95, "client's view"],
    ],
    resolved: ['yes', -472, 'Countersigned SOW arrived mid-afternoon, four days before the close. The procurement squeeze cost us the second analyst, as expected.'],
  },
  {
    id: 'demo-norrowby-wms-golive',
    title: "Norrowby's new warehouse management system is live at the Midlands hub by the planned date",
    rule: 'Yes if the Midlands hub ships live customer orders through the new WMS (not the old one running in parallel) before the close. A pilot on one aisle does not count.',
    kind: 'event',
    tags: ['client:norrowby', 'delivery'],
    open: -520,
    close: -430,
    base: [0.35, '7 of 20 WMS go-lives in our notes hit their first announced date'],
    forecasts: [
      [-520, 0.4, "Vendor's plan is tight but not silly. Two weeks of float, both of which will go on data migration."],
      [-498, 0.3, 'Integration test cycle 2 failed on label printing. Vendor says a week; vendors always say a week.'],
      [-470, 0.25, 'Label printing fixed, but the peak-season freeze now starts in six weeks, so any further slip pushes the go-live well back.'],
      [-446, 0.15, 'User acceptance testing found the pick-path optimiser sending people the long way round. Nobody on the floor trusts it yet.'],
    ],
    refs: [[-505, 0.8, "vendor's plan"]],
    resolved: ['no', -429, 'Go-live moved past peak season, agreed at the steering committee. The outside view did the work here.'],
  },
  {
    id: 'demo-norrowby-grocery-tender',
    title: 'Norrowby is named preferred bidder for the regional grocery distribution tender',
    rule: "Yes if the retailer's procurement team names Norrowby preferred bidder in writing before the close. Being kept in a best-and-final round is not enough.",
    kind: 'event',
    tags: ['client:norrowby', 'procurement'],
    open: -460,
    close: -380,
    base: [0.25, 'four bidders on the shortlist and no reason yet to rate any above the others'],
    costs: [1, 2],
    forecasts: [
      [-460, 0.3, 'Incumbent has the depots; Norrowby has the better rate. Starting near one in four, a hair above for price.'],
      [-430, 0.45, 'Heard the incumbent had a service failure at the last peak that the retailer has not forgotten.',
        [[OUT, 0.25, 1], [IN, 0.55, 1], [DEVIL, 0.3, 0.5]]],
      [-402, 0.55, 'Through to best-and-final with one other bidder. Half and a bit.'],
    ],
    refs: [
      [-440, 0.8, "client's view"],
      [-402, 0.85, "client's view"],
    ],
    resolved: ['no', -379, "Incumbent kept the contract with a two-year extension. The service-failure story was true, but the retailer valued continuity more. The client's view was even further out than mine."],
  },
  {
    id: 'demo-norrowby-otd-quarter',
    title: "Norrowby's on-time-in-full delivery for the quarter is at or above 95%",
    rule: "Read off Norrowby's quarterly KPI pack: yes if on-time-in-full for the quarter is 95.0% or higher, as first published (later restatements do not count).",
    kind: 'state',
    tags: ['client:norrowby', 'delivery'],
    open: -400,
    close: -330,
    checkin: 14,
    base: [0.5, '95% was reached in 2 of the last 4 quarters'],
    forecasts: [
      [-400, 0.5, 'Coin toss on the history. The new routing should help from next month, if it lands.'],
      [-372, 0.55, 'First month at 94.6%; the second running at 95.8% on the weekly dashboard. Routing change went in cleanly.'],
      [-345, 0.6, 'Weekly figures holding above 95 into the last month. One bad week would still sink it.'],
    ],
    refs: [[-360, 0.7, 'steering committee']],
    resolved: ['yes', -326, 'Published at 95.3%. Close enough that I would not read much into the hit.'],
  },
  {
    id: 'demo-norrowby-shift-ballot',
    title: "Norrowby's union ballot on the new shift pattern returns a yes",
    rule: 'Yes if a ballot result announced before the close accepts the proposed four-on, four-off pattern. A ballot postponed past the close resolves no.',
    kind: 'event',
    tags: ['client:norrowby', 'delivery'],
    open: -350,
    close: -300,
    base: [0.6, 'sector survey: about 3 in 5 ballots on shift changes at comparable sites passed first time'],
    forecasts: [
      [-350, 0.35, 'Shop stewards briefed against it. The night-shift premium is the sticking point and the offer does not touch it.'],
      [-330, 0.2, 'The turnout campaign is being run by the people who oppose it. Revised offer still silent on nights.'],
      [-310, 0.15, 'Management refused to reopen the premium. I would be surprised by a yes.'],
    ],
    refs: [[-335, 0.6, "client's view"]],
    resolved: ['no', -299, 'Rejected 61/39 on a high turnout. Back to the table on the night premium.'],
  },
  {
    id: 'demo-norrowby-crossdock-lease',
    title: 'Norrowby renews the lease on its northern cross-dock instead of relocating',
    rule: 'Yes if Norrowby signs a lease renewal for the existing cross-dock before the close. Agreed heads of terms alone do not count.',
    kind: 'event',
    tags: ['client:norrowby', 'renewals'],
    open: -140,
    close: -60,
    base: [0.6, 'sector survey: 3 in 5 logistics operators renewed rather than moved at lease end'],
    forecasts: [
      [-140, 0.55, 'Landlord wants a big uplift; the alternative site needs a planning consent that is far from certain.'],
      [-110, 0.65, 'Planning consultation on the alternative site drew objections from the parish council.'],
      [-88, 0.7, 'Heads of terms agreed at a smaller uplift. Lawyers now.'],
    ],
    resolved: ['yes', -74, 'Lease renewed for ten years with a break at five.'],
  },
  {
    id: 'demo-norrowby-phase3-budget',
    title: "Norrowby's steering committee confirms the phase-3 budget in full at its next meeting",
    rule: "Yes if the steering committee minutes (or the sponsor's e-mail after the meeting) confirm the phase-3 budget in full before the close. A reduced budget resolves no.",
    kind: 'event',
    tags: ['client:norrowby', 'renewals'],
    open: -45,
    close: 1,
    base: [0.7, '14 of 20 comparable follow-on budgets were confirmed at the first committee'],
    costs: [1, 3],
    forecasts: [
      [-45, 0.65, 'Phase 2 landed well, but the new CFO is reviewing all discretionary spend.'],
      [-30, 0.6, 'Budget paper trimmed by the finance team before it even reached the committee pack. Not a good sign for "in full".',
        [[OUT, 0.7, 1], [IN, 0.5, 1], [DEVIL, 0.4, 0.5]]],
      [-8, 0.55, 'Sponsor says the trim has been reversed. I have heard that before.'],
      [-2, 0.6, "Pre-meeting with the CFO went well, by the sponsor's account."],
    ],
    refs: [
      [-20, 0.85, "client's view"],
      [-3, 0.7, 'steering committee'],
    ],
  },
  {
    id: 'demo-norrowby-framework-renewal',
    title: 'Norrowby renews our framework agreement for another two years',
    rule: 'Yes if a renewed framework agreement running at least two years is signed by both sides before the close.',
    kind: 'event',
    tags: ['client:norrowby', 'renewals'],
    open: -50,
    close: 120,
    checkin: 14,
    base: [0.7, '14 of 20 comparable renewals signed on time; 6 slipped'],
    costs: [1, 4],
    forecasts: [
      [-50, 0.7, 'Reference class it is. The relationship is good; the new CFO is the unknown.'],
      [-12, 0.65, 'CFO asked procurement for a benchmark of advisory rates. Not hostile, but not nothing.'],
    ],
    refs: [[-12, 0.9, "client's view"]],
  },

  // ── Wendlebrook Water: programme office for a mid-size water utility ─────────────
  {
    id: 'demo-wendlebrook-pmo-extension',
    title: 'Wendlebrook Water extends our programme-office support into the next financial year',
    rule: 'Yes if a purchase order or contract variation extending our programme-office support past the current financial year is issued before the close.',
    kind: 'event',
    tags: ['client:wendlebrook', 'renewals'],
    open: -480,
    close: -410,
    base: [0.6, '12 of 20 comparable PMO engagements were extended at least once'],
    costs: [1, 3],
    forecasts: [
      [-480, 0.6, 'Programme director likes the reporting; finance is less keen on consultants in the run-rate. Base rate it is.'],
      [-455, 0.7, 'Asked us to scope a lighter-touch option. People do not scope things they plan to cancel.'],
      [-425, 0.75, 'Lighter option priced and accepted verbally. Waiting on the PO system, which has its own weather.'],
    ],
    resolved: ['yes', -414, 'PO raised for a six-month extension at the lighter scope.'],
  },
  {
    id: 'demo-wendlebrook-metering-board',
    title: "Wendlebrook's board approves the smart-metering business case at its next meeting",
    rule: "Yes if the board minutes (or the programme director's written confirmation) show approval of the full business case at that meeting. Approval 'in principle' or a deferral resolves no.",
    kind: 'event',
    tags: ['client:wendlebrook', 'delivery'],
    open: -440,
    close: -372,
    base: [0.65, '13 of 20 capital cases we have supported passed at the first board they went to'],
    costs: [2, 1],
    forecasts: [
      [-440, 0.7, 'The case is solid: payback inside eight years even on the pessimistic tariff. The executive sponsor is the CEO.'],
      [-415, 0.8, 'Pre-read went to the audit committee chair, who asked two sensible questions and said she was "comfortable".',
        [[OUT, 0.65, 1], [IN, 0.9, 1], [DEVIL, 0.6, 0.5]]],
      [-390, 0.85, 'Every executive has signed the paper. I cannot see where a no comes from.'],
    ],
    refs: [
      [-400, 0.9, "client's view"],
      [-385, 0.75, 'steering committee'],
    ],
    resolved: ['no', -371, 'Deferred to the following board. A new finance director had started three weeks earlier and wanted a second look at the payback period. Nobody mentioned a new FD in any meeting I was in. Lesson: ask who is new around the table.'],
  },
  {
    id: 'demo-wendlebrook-leakage',
    title: "Wendlebrook's reported leakage for the year comes in below its regulatory target",
    rule: 'Read off the annual performance report as published: yes if three-year-average leakage is below the target figure.',
    kind: 'state',
    tags: ['client:wendlebrook', 'regulation'],
    open: -380,
    close: -230,
    base: [0.4, 'below target in 2 of the previous 5 years'],
    forecasts: [
      [-380, 0.4, 'Base rate. Nothing in the data yet.'],
      [-330, 0.3, 'The hard freeze burst more mains than the plan allowed for. Repair gangs are two weeks behind.'],
      [-280, 0.35, 'Find-and-fix campaign is ahead of plan. Probably not enough to undo the freeze.'],
      [-250, 0.3, 'Draft figures circulating internally: just over target. Leaving a little room for final adjustments.'],
    ],
    resolved: ['no', -225, 'Published just over target. The freeze did it.'],
  },
  {
    id: 'demo-regulator-methodology',
    title: 'The water sector regulator publishes its final price-review methodology on schedule',
    rule: "Yes if the final methodology document is on the regulator's website before the close (its published date). A consultation draft does not count.",
    kind: 'event',
    tags: ['client:wendlebrook', 'regulation'],
    open: -300,
    close: -255,
    base: [0.85, 'the regulator met 6 of its last 7 published milestones'],
    forecasts: [
      [-300, 0.85, 'The timetable is published and they have kept to it so far.'],
      [-275, 0.9, 'Their chief executive repeated the date at a sector conference.'],
    ],
    refs: [[-290, 0.9, 'sector survey']],
    resolved: ['yes', -258, 'Published three days early.'],
  },
  {
    id: 'demo-wendlebrook-meter-contract',
    title: "Wendlebrook signs the smart-meter supply contract before the supplier's price hold expires",
    rule: 'Yes if Wendlebrook and the preferred supplier have both signed the supply contract before the close, when the price hold expires.',
    kind: 'event',
    tags: ['client:wendlebrook', 'procurement'],
    open: -90,
    close: -2,
    base: [0.55, '11 of 20 large utility supply contracts we tracked were signed inside the price hold'],
    forecasts: [
      [-90, 0.55, 'Business case finally through the board at the second attempt. Now the commercial part.'],
      [-60, 0.5, 'Supplier wants indexation on meter prices; the finance director refuses on principle.'],
      [-25, 0.65, 'Capped indexation agreed. Legal drafting under way.'],
      [-9, 0.7, 'Two clauses left: the liability cap and data ownership.'],
    ],
    refs: [[-20, 0.8, "client's view"]],
  },
  {
    id: 'demo-regulator-leakage-incentive',
    title: "The regulator's draft determination keeps the leakage incentive rate at or above today's level",
    rule: 'Read off the draft determination at the close: yes if the leakage outperformance incentive rate is at or above the current rate. Void if the draft has not been published by then.',
    kind: 'state',
    tags: ['client:wendlebrook', 'regulation'],
    open: -100,
    close: 70,
    base: [0.75, 'at or above the previous rate in 3 of the last 4 reviews (kept twice, raised once)'],
    forecasts: [
      [-100, 0.7, 'Base rate, shaded down: the consultation paper talks a lot about "affordability".'],
      [-65, 0.6, 'A sector survey of finance directors expects a cut. They would, but they read the same papers I do.'],
      [-18, 0.6, 'Nothing new. Holding.'],
    ],
    refs: [[-65, 0.4, 'sector survey']],
  },

  // ── Tollmere Hospitals Trust: electronic patient record programme ────────────────
  {
    id: 'demo-tollmere-migration-lot',
    title: 'Tollmere Hospitals Trust awards the data-migration lot to the incumbent supplier',
    rule: "Yes if the trust's contract award notice for the data-migration lot, published before the close, names the incumbent supplier.",
    kind: 'event',
    tags: ['client:tollmere', 'procurement'],
    open: -420,
    close: -350,
    base: [0.65, 'incumbents kept 13 of 20 comparable public-sector IT lots'],
    forecasts: [
      [-420, 0.65, 'The incumbent has the data dictionary in their heads. Switching cost is the whole argument.'],
      [-395, 0.7, 'Only two compliant bids. The challenger priced low but scored badly on the quality questions, I hear.'],
    ],
    refs: [[-400, 0.6, 'steering committee']],
    resolved: ['yes', -356, 'Award notice names the incumbent.'],
  },
  {
    id: 'demo-tollmere-epr-golive',
    title: "Tollmere's electronic patient record goes live on the planned cut-over weekend",
    rule: 'Yes if the trust switches clinical record-keeping to the new system on or before the planned cut-over weekend. A rehearsal or a go-live in one division only does not count.',
    kind: 'event',
    tags: ['client:tollmere', 'delivery'],
    open: -360,
    close: -190,
    checkin: 14,
    base: [0.3, '3 of 10 hospital EPR programmes in our reference set went live on the first planned date'],
    costs: [1, 2],
    forecasts: [
      [-360, 0.3, 'Base rate. The plan has no contingency weekend, which is its own answer.'],
      [-320, 0.35, 'Data-migration rehearsal 1 passed with fewer errors than the plan allowed. Unusual.'],
      [-270, 0.45, 'Rehearsal 2 clean too. The clinical safety officer is engaged rather than hostile.',
        [[OUT, 0.3, 1], [IN, 0.6, 1]]],
      [-230, 0.4, 'Training completion at 71% against 90% needed. Ward managers say rotas will not release people.'],
      [-205, 0.4, 'Training up to 84%. Go/no-go meeting in a fortnight.'],
    ],
    refs: [
      [-300, 0.75, "client's view"],
      [-215, 0.7, 'steering committee'],
    ],
    resolved: ['no', -189, "Go/no-go said no: training short in two divisions. Cut-over moved to a later weekend. The client's view sat about thirty points above the reference class the whole way."],
  },
  {
    id: 'demo-tollmere-director-leaves',
    title: "Tollmere's EPR programme director leaves the role before go-live",
    rule: 'Yes if the programme director announces a departure from the role (resignation, secondment or reassignment) before the close. Sick leave does not count.',
    kind: 'event',
    tags: ['client:tollmere', 'delivery'],
    open: -330,
    close: -190,
    base: [0.15, 'roughly 3 of 20 senior programme leads in our notes left mid-programme'],
    forecasts: [
      [-330, 0.1, 'She built this programme and says she wants to see it through. Below the base rate.'],
      [-280, 0.1, 'No change. Very visible at the board and clearly enjoying it.'],
      [-245, 0.05, 'Just negotiated a budget uplift for the next phase. People who are leaving do not do that.'],
    ],
    resolved: ['yes', -238, 'Announced a move to a regional role at the programme board. I read her commitment to the finish line as a fact rather than a preference. The base rate was kinder to me than I was to it.'],
  },
  {
    id: 'demo-tollmere-incident-backlog',
    title: "Tollmere's post-go-live incident backlog is below 50 open tickets at the 90-day review",
    rule: 'Read off the service-desk report presented at the 90-day review: yes if fewer than 50 EPR incidents are open.',
    kind: 'state',
    tags: ['client:tollmere', 'delivery'],
    open: -80,
    close: -6,
    base: [0.4, 'post-go-live backlogs in our reference set: 4 of 10 under 50 by day 90'],
    forecasts: [
      [-80, 0.35, 'Go-live finally happened; 212 open incidents at day ten.'],
      [-50, 0.45, 'Down to 120 and falling by about fifteen a week.'],
      [-20, 0.55, 'At 74 with three weeks to go. The trend says yes; the last tickets are always the slowest to close.'],
    ],
    refs: [[-30, 0.6, 'steering committee']],
  },

  // ── Pellbridge Bank: the retail bank's digital unit ──────────────────────────────
  {
    id: 'demo-pellbridge-onboarding-launch',
    title: "Pellbridge Bank's new mobile onboarding flow is open to all new customers by the announced date",
    rule: 'Yes if the new onboarding flow is the default for all new current-account applicants on the mobile app before the close. A staged rollout below 100% resolves no.',
    kind: 'event',
    tags: ['client:pellbridge', 'delivery'],
    open: -380,
    close: -320,
    base: [0.5, '5 of 10 comparable launches at regulated banks made their first announced date'],
    costs: [1, 1],
    forecasts: [
      [-380, 0.6, 'Build is complete; the remaining gates are the pen test and the conduct-risk sign-off.'],
      [-360, 0.75, 'Conduct risk signed off early. Beta conversion eleven points up on the old flow.'],
      [-340, 0.82, 'Pen test booked, 20% rollout going smoothly. Treating the security gate as a formality.',
        [[OUT, 0.5, 1], [IN, 0.9, 1], [DEVIL, 0.65, 0.5]]],
    ],
    refs: [[-350, 0.9, "client's view"]],
    resolved: ['no', -319, 'Pen test found a flaw in the document-upload step; rollout held at 20% until a fix shipped two months later. I had assumed the security gate was a formality. It is the gate that most often is not.'],
  },
  {
    id: 'demo-pellbridge-headcount',
    title: 'Pellbridge cuts permanent headcount in its digital unit in the restructure',
    rule: 'Yes if the bank announces a reduction in permanent digital-unit roles as part of the current restructure, before the close.',
    kind: 'event',
    tags: ['client:pellbridge', 'hiring'],
    open: -330,
    close: -250,
    base: [0.3, 'sector survey: about 3 in 10 retail banks trimmed digital teams in the last round'],
    forecasts: [
      [-330, 0.25, 'The digital unit is the part the CEO talks about on results calls. Probably protected.'],
      [-300, 0.4, 'Cost-income target raised at the investor day. Everything is on the table, including things the CEO likes.'],
      [-272, 0.55, 'HR business partner asked us for a role map of the unit "for planning". That is how it starts.'],
    ],
    resolved: ['yes', -262, 'Eight permanent roles cut, mostly in platform engineering. Contractors were kept, which tells you something.'],
  },
  {
    id: 'demo-pellbridge-app-rating',
    title: "Pellbridge's app store rating is at or above 4.5 at the end of the half-year",
    rule: "Read off the iOS App Store rating for the bank's main app at the close (screenshot kept in the engagement folder). Yes if 4.5 or higher.",
    kind: 'state',
    tags: ['client:pellbridge', 'delivery'],
    open: -290,
    close: -200,
    closeAt: '23:59',
    base: [0.6, 'at or above 4.5 at 6 of the last 10 month-ends'],
    forecasts: [
      [-290, 0.6, 'Base rate from the month-end history.'],
      [-255, 0.7, 'New onboarding flow finally at 100%; the first reviews mention it by name.'],
      [-215, 0.75, 'Rating at 4.6 and steady. A bad outage could still drag it down.'],
    ],
    resolved: ['yes', -199, 'Closed the half-year at 4.6.'],
  },
  {
    id: 'demo-pellbridge-openbanking-pilot',
    title: "Pellbridge's open-banking pilot reaches 10,000 monthly active users in its final month",
    rule: 'Read off the pilot dashboard for the month ending at the close: yes if it shows at least 10,000 monthly active users (one login or more in the month).',
    kind: 'state',
    tags: ['client:pellbridge', 'delivery'],
    open: -260,
    close: -168,
    base: [0.35, 'internal pilots at this bank: 4 of 11 hit their adoption target'],
    forecasts: [
      [-260, 0.35, 'Starting at the base rate.'],
      [-230, 0.3, 'Marketing push delayed by a month. First month at 3,100.'],
      [-195, 0.45, 'Jumped to 7,400 after the in-app banner.'],
    ],
    resolved: ['void', -160, "The bank redefined 'active' as 'made a payment' mid-month and switched the old measure off. No fair reading of the rule as written."],
  },
  {
    id: 'demo-pellbridge-payments-cloud',
    title: "Pellbridge's payments service runs from the new cloud platform by the end of the quarter",
    rule: 'Yes if production payment traffic is served from the new cloud platform, with the old data centre on standby only, before the close.',
    kind: 'event',
    tags: ['client:pellbridge', 'delivery'],
    open: -150,
    close: -45,
    base: [0.3, '3 of 10 core-system migrations at regulated firms in our notes finished in the planned quarter'],
    forecasts: [
      [-150, 0.35, 'One rehearsal and no rollback test in the plan. I have seen this plan before.'],
      [-120, 0.4, 'Rollback test added at our suggestion. Rehearsal passed.'],
      [-80, 0.3, 'The regulator asked for a resilience self-assessment first. Six weeks of work nobody planned for.'],
    ],
    refs: [
      [-120, 0.7, "client's view"],
      [-80, 0.5, 'steering committee'],
    ],
    resolved: ['no', -44, 'Still on the old data centre at quarter end; cut-over planned for next quarter once the self-assessment is accepted.'],
  },
  {
    id: 'demo-pellbridge-card-controls',
    title: "Pellbridge's card-controls feature is approved by the change advisory board",
    rule: 'Yes if the change advisory board approves the card-controls release for production before the close. Approval with conditions counts; a deferral does not.',
    kind: 'event',
    tags: ['client:pellbridge', 'delivery'],
    open: -35,
    close: 2,
    closeAt: '12:00',
    base: [0.75, '15 of 20 releases from this unit passed the board at first submission'],
    forecasts: [
      [-35, 0.75, 'Base rate; the team has been good at paperwork since the pen-test episode.'],
      [-14, 0.8, 'Security review clean. Pen test booked well ahead this time.'],
      [-3, 0.85, 'Board pack in on time with no open risks. This is what the pen-test lesson bought us. Then again, I said 0.82 last time.'],
    ],
  },

  // ── Hollin Dales Food Co-operative ───────────────────────────────────────────────
  {
    id: 'demo-hollindales-grading-line',
    title: 'Hollin Dales members approve the new grading-line investment at the AGM',
    rule: 'Yes if the AGM vote, held before the close, approves the grading-line capital investment. Approval subject to a later ballot resolves no.',
    kind: 'event',
    tags: ['client:hollindales', 'delivery'],
    open: -300,
    close: -245,
    base: [0.75, 'the co-op passed 6 of its last 8 capital proposals at the AGM'],
    forecasts: [
      [-300, 0.7, 'The board is behind it. Smaller growers worry the grading fee will rise.'],
      [-275, 0.75, 'Fee cap for small growers added to the proposal. That was the objection.'],
      [-255, 0.8, "Proxy count from the secretary: comfortably ahead."],
    ],
    resolved: ['yes', -246, 'Passed with 78% of votes cast.'],
  },
  {
    id: 'demo-hollindales-sydney-distributor',
    title: "Hollin Dales' Sydney distributor signs the three-year export agreement",
    rule: 'Yes if the distributor returns the signed three-year agreement before the close (Sydney time).',
    kind: 'event',
    tags: ['client:hollindales', 'procurement'],
    zone: 'Australia/Sydney',
    open: -280,
    close: -195,
    base: [0.4, 'sector survey: about 2 in 5 first export agreements signed within a quarter of the first meeting'],
    forecasts: [
      [-280, 0.4, 'The distributor likes the product and hates the shipping terms. Base rate.'],
      [-245, 0.5, 'The co-op agreed to split freight costs for the first year.'],
      [-210, 0.6, 'Their lawyers asked only about the termination clause. That is a signing question.'],
    ],
    refs: [[-240, 0.7, "client's view"]],
    resolved: ['yes', -199, 'Signed agreement arrived overnight, London time.'],
  },
  {
    id: 'demo-hollindales-plant-audit',
    title: "Hollin Dales' new packing plant passes its retailer accreditation audit at the first attempt",
    rule: 'Yes if the first accreditation audit at the new packing plant, held before the close, ends in a pass (minor non-conformities allowed). No if it fails or needs a re-audit.',
    kind: 'event',
    tags: ['client:hollindales', 'regulation'],
    open: -200,
    close: -120,
    base: [0.7, 'sector survey: 7 of 10 new food plants passed first time'],
    forecasts: [
      [-200, 0.7, 'Base rate.'],
      [-170, 0.75, 'Mock audit found only paperwork gaps. The quality manager has done this before.'],
    ],
    resolved: ['void', -150, 'The retailer cancelled the audit and moved the plant into its new supplier scheme, which has no first-attempt audit at all. The question no longer asks anything.'],
  },
  {
    id: 'demo-hollindales-own-label',
    title: "Hollin Dales wins a place on the retailer's own-label range for the coming season",
    rule: 'Yes if the retailer confirms Hollin Dales as a supplier for the own-label range in writing before the close.',
    kind: 'event',
    tags: ['client:hollindales', 'procurement'],
    open: -60,
    close: 18,
    base: [0.35, 'the co-op has won 7 of its last 20 tenders of this size'],
    costs: [1, 2],
    forecasts: [
      [-60, 0.35, 'Base rate. The new grading line helps on quality scores; price will decide it.'],
      [-28, 0.45, 'Invited to the site-visit round: three suppliers left.'],
    ],
    refs: [[-25, 0.6, "client's view"]],
  },

  // ── Halloway Cold Chain: a New York prospect ─────────────────────────────────────
  {
    id: 'demo-halloway-shortlist',
    title: 'Halloway Cold Chain shortlists us for its network review',
    rule: "Yes if Halloway's procurement lead invites us to the final presentation round before the close (New York time).",
    kind: 'event',
    tags: ['client:halloway', 'procurement'],
    zone: 'America/New_York',
    open: -200,
    close: -150,
    base: [0.3, 'first pitches to new US clients: 3 of our last 10 reached the final round'],
    forecasts: [
      [-200, 0.3, 'Cold approach after the freight conference. We know the work; they do not know us.'],
      [-180, 0.3, 'Written proposal in. Their questions were all about our US presence, which is one person.'],
    ],
    resolved: ['no', -148, 'Not shortlisted: they went with firms that have a New York office. Fair.'],
  },
  {
    id: 'demo-halloway-diagnostic',
    title: 'Halloway Cold Chain signs a paid two-week diagnostic with us',
    rule: 'Yes if a signed statement of work for a paid diagnostic (of any size) reaches us before the close (New York time).',
    kind: 'event',
    tags: ['client:halloway', 'procurement', 'pricing'],
    zone: 'America/New_York',
    open: -40,
    close: 45,
    base: [0.2, 'prospects who turned us down and came back: 2 of 10 bought something within a quarter'],
    forecasts: [
      [-40, 0.25, "Their procurement lead called: the winning firm's proposal ran long and they want a second opinion on the depot model."],
      [-15, 0.3, 'Sent a fixed-price diagnostic. Fixed price is what they asked about twice.'],
    ],
  },

  // ── Quillmere Advisory itself: hiring and pricing ────────────────────────────────
  {
    id: 'demo-quillmere-senior-hire',
    title: 'We hire a senior consultant (signed offer) within the quarter',
    rule: 'Yes if a senior consultant candidate has signed our offer before the close. The start date may be later.',
    kind: 'event',
    tags: ['internal', 'hiring'],
    open: -420,
    close: -330,
    base: [0.45, 'our last 11 senior searches: 5 closed within three months'],
    costs: [1, 2],
    forecasts: [
      [-420, 0.5, 'Two strong candidates from the referral round. Both employed, both comfortable.'],
      [-390, 0.65, 'Candidate A through the case interview, very good on the freight material.',
        [[OUT, 0.45, 1], [IN, 0.75, 1]]],
      [-360, 0.6, 'Candidate A asking about the partner track earlier than I would like. Candidate B withdrew.'],
    ],
    resolved: ['no', -329, 'Candidate A took a counter-offer. Search restarts next quarter.'],
  },
  {
    id: 'demo-quillmere-day-rate',
    title: 'All three framework clients accept the 6% day-rate rise at renewal',
    rule: 'Yes if Norrowby, Wendlebrook and Pellbridge have each confirmed the new rate card in writing before the close. A rise agreed for some grades only resolves no.',
    kind: 'event',
    tags: ['internal', 'pricing'],
    open: -250,
    close: -190,
    base: [0.55, '3 of our last 5 rate rises were accepted by every framework client'],
    forecasts: [
      [-250, 0.5, 'Pellbridge procurement will push back on principle; the question is whether they push back on substance.'],
      [-225, 0.6, 'Norrowby and Wendlebrook confirmed within a week. Pellbridge wants a call.'],
      [-205, 0.65, 'The Pellbridge call went fine: they want a volume discount in return, which we can give on analyst days.'],
    ],
    resolved: ['yes', -196, 'Pellbridge signed the full rate card, with a volume discount on analyst days above a threshold. Counts as accepted under the rule.'],
  },
  {
    id: 'demo-quillmere-analyst-offer',
    title: 'Our preferred candidate accepts the analyst offer',
    rule: 'Yes if the candidate signs the offer before the close. A request to extend the deadline resolves no if it runs past the close.',
    kind: 'event',
    tags: ['internal', 'hiring'],
    open: -10,
    close: 3,
    closeAt: '12:00',
    base: [0.6, 'our last 10 analyst offers: 6 accepted'],
    forecasts: [
      [-10, 0.55, 'Strong candidate with a second offer from a larger firm. We pay less and offer more variety.'],
      [-4, 0.65, 'Asked good questions about the Hollin Dales work at the follow-up coffee. Engaged, not shopping.'],
    ],
  },
  {
    id: 'demo-quillmere-utilisation',
    title: 'Team utilisation for the quarter is at or above 70%',
    rule: 'Read off the timesheet report for the quarter ending at the close: yes if billable days divided by available days is 70% or more.',
    kind: 'state',
    tags: ['internal', 'pricing'],
    open: -65,
    close: 25,
    base: [0.5, '70% reached in 3 of the last 6 quarters'],
    forecasts: [
      [-65, 0.5, 'Base rate.'],
      [-33, 0.6, 'The Halloway diagnostic would take us over if it lands; without it the plan says about 68%.'],
      [-6, 0.55, 'Two people on leave in the last fortnight of the quarter. Shaving it.'],
    ],
  },
  {
    id: 'demo-quillmere-realised-rate',
    title: 'Our blended realised day rate for the half-year is within 8% of the rate card',
    rule: 'Read off the management accounts for the half-year ending at the close: yes if fee income divided by days billed is at least 92% of the standard rate card.',
    kind: 'state',
    tags: ['internal', 'pricing'],
    open: -75,
    close: 100,
    checkin: 30,
    base: [0.5, 'managed in 2 of the last 4 half-years'],
    forecasts: [
      [-75, 0.5, 'The new rate card helps; the Pellbridge volume discount hurts. Net: base rate.'],
      [-40, 0.55, 'Fewer fixed-price overruns this half, so far.'],
    ],
  },
];

/**
 * mulberry32: a small seeded generator (public-domain, Tommy Ettinger), used only to vary
 * the minute of each entry so the diary does not look machine-made; the fixed seed keeps
 * the demo identical for the same `now`.
 */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const SEED = 20_240_917;

/** The instant `day` local calendar days from `today` (a date in `zone`), at `minutes` past midnight. */
function localInstant(today: WallTime, zone: string, day: number, minutes: number): number {
  const date = addCalendarDays(today, day);
  return wallTimeToInstant({ ...date, hour: Math.floor(minutes / 60), minute: minutes % 60, second: 0 }, zone);
}

function hhmmToMinutes(text: string): number {
  const [h, m] = text.split(':').map(Number) as [number, number];
  return h * 60 + m;
}

/**
 * The example diary with every time placed relative to `now` (epoch ms). Openings fall
 * around 09:00, revisions between 08:30 and 17:30, reference forecasts between 10:00 and
 * 17:00 and resolutions between 09:30 and 16:30, all in the diary's zone; closes at the
 * row's local close time in the question's zone.
 */
export function buildDemoDiary(now: number): DiaryFileObject {
  const rand = mulberry32(SEED);
  const minuteIn = (from: number, span: number) => from + Math.floor(rand() * span);
  // Today's date in each zone, read once: Intl formatting is the slow part of this build.
  const todays = new Map<string, WallTime>();
  const todayIn = (zone: string): WallTime => {
    let today = todays.get(zone);
    if (!today) {
      today = wallTimeAt(now, zone);
      todays.set(zone, today);
    }
    return today;
  };
  const at = (day: number, minutes: number) => toIso(localInstant(todayIn(DIARY_ZONE), DIARY_ZONE, day, minutes));

  const questions = ROWS.map((row): DiaryFileQuestion => {
    const zone = row.zone ?? DIARY_ZONE;
    const openMinutes = minuteIn(8 * 60 + 45, 60);
    const forecasts = row.forecasts.map(([day, p, note, lenses]) => {
      // The opening revision is written a few minutes after the question itself.
      const minutes = day === row.open ? openMinutes + minuteIn(5, 30) : minuteIn(8 * 60 + 30, 9 * 60);
      const f: DiaryFileQuestion['forecasts'][number] = { at: at(day, minutes), p, note };
      if (lenses) f.lenses = lenses.map(([name, lp, weight]) => ({ name, p: lp, weight }));
      return f;
    });
    const references = (row.refs ?? []).map(([day, p, source]) => ({ at: at(day, minuteIn(10 * 60, 7 * 60)), p, source }));
    const resolution = row.resolved
      ? { outcome: row.resolved[0], at: at(row.resolved[1], minuteIn(9 * 60 + 30, 7 * 60)), note: row.resolved[2] }
      : null;
    // Keys in the order INTERFACES.md §1 lists them, so an exported demo reads naturally.
    return {
      id: row.id,
      title: row.title,
      rule: row.rule,
      kind: row.kind === 'event' ? 'event_by_deadline' : 'state_at_deadline',
      tags: [...row.tags],
      opened_at: at(row.open, openMinutes),
      closes_at: toIso(localInstant(todayIn(zone), zone, row.close, hhmmToMinutes(row.closeAt ?? '17:00'))),
      time_zone: zone,
      ...(row.base ? { base_rate: row.base[0], base_rate_note: row.base[1] } : {}),
      ...(row.costs ? { costs: { false_alarm: row.costs[0], miss: row.costs[1] } } : {}),
      ...(row.checkin !== undefined ? { checkin_days: row.checkin } : {}),
      forecasts,
      references,
      resolution,
    };
  });
  // After the yes/no rows, so their seeded minutes stay as they were.
  const londonToday = todayIn(DIARY_ZONE);
  const clock = {
    at,
    minuteIn,
    closeAt: (day: number) => toIso(localInstant(londonToday, DIARY_ZONE, day, hhmmToMinutes('17:00'))),
    date: (day: number) => {
      const d = addCalendarDays(londonToday, day);
      return `${String(d.year).padStart(4, '0')}-${String(d.month).padStart(2, '0')}-${String(d.day).padStart(2, '0')}`;
    },
    zone: DIARY_ZONE,
  };
  const typed = TYPED_ROWS.map((row) => buildTypedQuestion(row, clock));

  return {
    format: DIARY_FORMAT,
    version: DIARY_VERSION,
    settings: {
      default_false_alarm_cost: 1,
      default_miss_cost: 1,
      default_checkin_days: 7,
      closing_soon_hours: 24,
      overdue_after_days: 3,
      time_zone: DIARY_ZONE,
      quiet_hours: { start: '21:00', end: '07:30' },
    },
    questions: [...questions, ...typed],
  };
}
