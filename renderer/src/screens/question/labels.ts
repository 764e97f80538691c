/** Words for a question's fields, shared by the list, the page and the forms. */
import type { QuestionKind } from '../../../../shared/domain';
import type { SelectOption } from '../../components/Select';

export const KIND_LABELS: Record<QuestionKind, string> = {
  event_by_deadline: 'Event by deadline',
  state_at_deadline: 'State at deadline',
};

export const KIND_HINTS: Record<QuestionKind, string> = {
  event_by_deadline: 'may happen any time before the close',
  state_at_deadline: 'read off at the close',
};

export const KIND_OPTIONS: readonly SelectOption[] = (Object.keys(KIND_LABELS) as QuestionKind[]).map((kind) => ({
  value: kind,
  label: KIND_LABELS[kind],
}));

/** The hint under a kind selector: what the chosen kind means, as a sentence. */
export function kindHint(kind: QuestionKind): string {
  const hint = KIND_HINTS[kind];
  return `${hint.charAt(0).toUpperCase()}${hint.slice(1)}.`;
}
