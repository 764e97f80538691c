/**
 * The stale notice on a question page: the latest forecast of an event-by-deadline question
 * has sat well above its glide path for longer than the check-in cadence (SCORING.md
 * "Helpers"; the same rule that flags the question in the list). One line of explanation
 * and a way to revise.
 */
import type { BinaryQuestion, Settings } from '../../../shared/domain';
import { Button } from '../components/Button';
import { formatPercent } from '../percent';
import { formatEstimate, plural } from './format';
import { staleness } from './glide';
import './tools.css';

interface Props {
  question: BinaryQuestion;
  settings: Pick<Settings, 'default_checkin_days'>;
  onRevise: () => void;
}

export function StaleNotice({ question, settings, onRevise }: Props) {
  const stale = staleness(question, settings, Date.now());
  if (!stale) return null;
  return (
    <section className="stale-notice" aria-labelledby="stale-heading" data-testid="stale-notice">
      <div>
        <h2 id="stale-heading" className="stale-notice__title">
          This forecast has gone stale
        </h2>
        <p>
          Nothing has happened for {plural(stale.days, 'day')}; by a constant hazard your {formatPercent(stale.p)} would now be {formatEstimate(stale.now)}. Is it
          still your number?
        </p>
      </div>
      {/* Not called "Revise": the page's toolbar already has that button, and one name means one action. */}
      <Button onClick={onRevise}>Update your forecast</Button>
    </section>
  );
}
