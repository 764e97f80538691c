/**
 * Quick add's fields for the question's type: the type itself (fixed once saved), then a
 * choice question's options, ordering, option base rates and first chances, or a numeric
 * question's unit, value kind, levels and first range. `useTypedDraft` holds what is typed
 * and reads it into the request on save; the yes/no fields stay in the form itself.
 */
import { useState } from 'react';
import type { NumericValue, ValueKind } from '../../../shared/domain';
import { fromStoredValue } from '../../../shared/numeric-value';
import { ChoiceGroup } from '../components/ChoiceGroup';
import { Select } from '../components/Select';
import { TextField } from '../components/TextField';
import { ChoiceForecastInput } from '../forecastEntry/ChoiceForecastInput';
import { readChoiceForecast, type ChoiceProblems } from '../forecastEntry/choiceEntry';
import { NumericForecastInput } from '../forecastEntry/NumericForecastInput';
import { readNumericForecast, type NumericProblems } from '../forecastEntry/numericEntry';
import { LEVEL_PRESETS, TYPE_CHOICES, TYPE_HINTS, levelsText, readOptionBaseRates, readOptions, type QuestionType } from './definition';
import { OptionsEditor } from './OptionsEditor';

/** `texts` cut or padded with blanks to `n` boxes (the option list grew or shrank). */
function fit(texts: readonly string[], n: number): string[] {
  return Array.from({ length: n }, (_, k) => texts[k] ?? '');
}

/** The type's own request fields and first forecast value, as `createQuestion` takes them. */
export interface TypedRequestFields {
  type?: 'choice' | 'numeric';
  options?: string[];
  ordered?: boolean;
  option_base_rates?: number[] | null;
  unit?: string;
  value_kind?: ValueKind;
  levels?: number[];
}

export interface TypedFirstForecast {
  probs?: number[];
  quantiles?: NumericValue[];
}

export function useTypedDraft() {
  const [type, setType] = useState<QuestionType>('binary');
  const [options, setOptions] = useState<string[]>(['', '', '']);
  const [ordered, setOrdered] = useState(false);
  const [rates, setRates] = useState<string[]>([]);
  const [chances, setChances] = useState<string[]>([]);
  const [unit, setUnit] = useState('');
  const [valueKind, setValueKind] = useState<ValueKind>('number');
  const [levelsKey, setLevelsKey] = useState(LEVEL_PRESETS[0]!.value);
  const [values, setValues] = useState<string[]>([]);
  // Typed into since the last save attempt: the form's own reasons for the boxes are stale then.
  const [edited, setEdited] = useState(false);
  const [problems, setProblems] = useState<{ options?: Record<number, string>; rates?: ChoiceProblems; chances?: ChoiceProblems; values?: NumericProblems }>({});
  const levels = (LEVEL_PRESETS.find((p) => p.value === levelsKey) ?? LEVEL_PRESETS[0]!).levels;

  const dirty =
    type !== 'binary' &&
    (options.some((o) => o !== '') || ordered || rates.some((r) => r !== '') || chances.some((c) => c !== '') || unit !== '' || values.some((v) => v !== ''));

  /**
   * Reads the type's fields into `found` (field → reason) and returns what to add to the
   * request, and the first forecast's value (null when its boxes are all blank).
   */
  function read(found: Record<string, string>): { fields: TypedRequestFields; first: TypedFirstForecast | null } {
    if (type === 'binary') return { fields: {}, first: null };
    setEdited(false);
    if (type === 'choice') {
      const labels = readOptions(options);
      const base = readOptionBaseRates(fit(rates, options.length));
      const boxes = fit(chances, options.length);
      const given = boxes.some((c) => c.trim() !== '');
      const first = given ? readChoiceForecast(boxes) : null;
      setProblems({ options: labels.problems, rates: base.problems, chances: first?.problems });
      if (!labels.ok) found.options = labels.error;
      if (!base.ok) found.option_base_rates = base.error;
      if (first && !first.ok) found['first_forecast.probs'] = first.error;
      return {
        fields: { type, options: labels.ok ? labels.value : options, ordered, option_base_rates: base.ok ? base.value : null },
        first: first?.ok ? { probs: first.value } : null,
      };
    }
    const boxes = fit(values, levels.length);
    const given = boxes.some((v) => v.trim() !== '');
    const first = given ? readNumericForecast(boxes, levels, valueKind, unit.trim()) : null;
    setProblems({ values: first?.problems });
    if (first && !first.ok) found['first_forecast.quantiles'] = first.error;
    return {
      fields: { type, unit: unit.trim(), value_kind: valueKind, levels: [...levels] },
      first: first?.ok ? { quantiles: first.value.map((v) => fromStoredValue(v, valueKind)) } : null,
    };
  }

  return {
    type,
    dirty,
    read,
    fields: (error: (field: string) => string | undefined) => (
      <TypedQuestionFields
        {...{ type, setType, options, setOptions, ordered, setOrdered, unit, setUnit, valueKind, setValueKind, levelsKey, setLevelsKey, levels, problems }}
        error={(field) => (edited && (field === 'option_base_rates' || field.startsWith('first_forecast.')) ? undefined : error(field))}
        rates={fit(rates, options.length)}
        setRates={setRates}
        chances={fit(chances, options.length)}
        setChances={setChances}
        values={fit(values, levels.length)}
        setValues={setValues}
        clearProblems={() => {
          setProblems({});
          setEdited(true);
        }}
      />
    ),
    typeChoice: (error: string | undefined) => (
      <ChoiceGroup legend="Type of answer" value={type} choices={TYPE_CHOICES} onChange={(v) => setType(v as QuestionType)} error={error} />
    ),
  };
}

interface FieldsProps {
  type: QuestionType;
  options: string[];
  setOptions: (v: string[]) => void;
  ordered: boolean;
  setOrdered: (v: boolean) => void;
  rates: string[];
  setRates: (v: string[]) => void;
  chances: string[];
  setChances: (v: string[]) => void;
  unit: string;
  setUnit: (v: string) => void;
  valueKind: ValueKind;
  setValueKind: (v: ValueKind) => void;
  levelsKey: string;
  setLevelsKey: (v: string) => void;
  levels: readonly number[];
  values: string[];
  setValues: (v: string[]) => void;
  problems: { options?: Record<number, string> | undefined; rates?: ChoiceProblems | undefined; chances?: ChoiceProblems | undefined; values?: NumericProblems | undefined };
  clearProblems: () => void;
  error: (field: string) => string | undefined;
}

const LEVEL_OPTIONS = LEVEL_PRESETS.map((p) => ({ value: p.value, label: levelsText(p.levels) }));
const KIND_OPTIONS = [
  { value: 'number', label: 'A number (with a unit)' },
  { value: 'date', label: 'A calendar date' },
];

function TypedQuestionFields(p: FieldsProps) {
  const labels = p.options.map((o, k) => o.trim() || `Option ${k + 1}`);
  const orFrom = (mine: ChoiceProblems | undefined, field: string): ChoiceProblems | undefined => mine ?? (p.error(field) ? { options: {}, total: p.error(field) } : undefined);
  if (p.type === 'binary') return null;
  if (p.type === 'choice') {
    return (
      <>
        <p className="field__hint">{TYPE_HINTS.choice}</p>
        <OptionsEditor value={p.options} onChange={p.setOptions} problems={p.problems.options} error={p.error('options')} />
        <label className="checkbox-field">
          <input type="checkbox" checked={p.ordered} onChange={(event) => p.setOrdered(event.target.checked)} />
          Ordered options (e.g. ranges of a quantity, or early / on time / late): scored by the ranked probability score too
        </label>
        <div className="form__row">
          <ChoiceForecastInput
            label="Option base rates (optional)"
            options={labels}
            value={p.rates}
            onChange={(next) => {
              p.clearProblems();
              p.setRates(next);
            }}
            problems={orFrom(p.problems.rates, 'option_base_rates')}
            hint="How often each option comes true in comparable cases."
          />
          <ChoiceForecastInput
            label="Your chances"
            options={labels}
            value={p.chances}
            onChange={(next) => {
              p.clearProblems();
              p.setChances(next);
            }}
            problems={orFrom(p.problems.chances, 'first_forecast.probs')}
            hint="Your first forecast, in percent; revise it as evidence arrives."
          />
        </div>
      </>
    );
  }
  return (
    <>
      <p className="field__hint">{TYPE_HINTS.numeric}</p>
      <div className="form__row">
        <Select label="Value" value={p.valueKind} options={KIND_OPTIONS} onChange={(v) => p.setValueKind(v as ValueKind)} error={p.error('value_kind')} />
        {p.valueKind === 'number' ? (
          <TextField label="Unit" value={p.unit} onChange={p.setUnit} placeholder="e.g. weeks, £k" error={p.error('unit')} />
        ) : null}
      </div>
      <div className="form__row">
        <Select
          label="Levels"
          value={p.levelsKey}
          options={LEVEL_OPTIONS}
          onChange={p.setLevelsKey}
          hint="Fixed once saved. P10 / P50 / P90 is the estimators’ default."
          error={p.error('levels')}
        />
      </div>
      <NumericForecastInput
        label="Your range"
        levels={p.levels}
        kind={p.valueKind}
        unit={p.unit.trim()}
        value={p.values}
        onChange={(next) => {
          p.clearProblems();
          p.setValues(next);
        }}
        problems={p.problems.values ?? (p.error('first_forecast.quantiles') ? { levels: {}, order: p.error('first_forecast.quantiles') } : undefined)}
      />
    </>
  );
}
