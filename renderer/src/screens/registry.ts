/**
 * Every screen the window can show, in navigation order. Adding a screen is one entry here:
 * its name, its address pattern (`:name` segments become params), the label in the
 * navigation bar (none for pages reached from another screen) and its component.
 */
import type { ComponentType } from 'react';
import { DeskScreen } from './desk/DeskScreen';
import { HindsightScreen } from './hindsight/HindsightScreen';
import { QuestionScreen } from './question/QuestionScreen';
import { QuestionsScreen } from './questions/QuestionsScreen';
import { ScorecardScreen } from './scorecard/ScorecardScreen';
import { SettingsScreen } from './settings/SettingsScreen';

export interface ScreenProps {
  params: Readonly<Record<string, string>>;
}

export interface ScreenEntry {
  name: string;
  /** e.g. "questions/:id" — matched against the part of the address after "#/". */
  path: string;
  navLabel?: string;
  component: ComponentType<ScreenProps>;
}

export const screens: readonly ScreenEntry[] = [
  { name: 'desk', path: 'desk', navLabel: 'Desk', component: DeskScreen },
  { name: 'questions', path: 'questions', navLabel: 'Questions', component: QuestionsScreen },
  { name: 'question', path: 'questions/:id', component: QuestionScreen },
  { name: 'scorecard', path: 'scorecard', navLabel: 'Scorecard', component: ScorecardScreen },
  { name: 'hindsight', path: 'hindsight', navLabel: 'Hindsight', component: HindsightScreen },
  { name: 'settings', path: 'settings', navLabel: 'Settings', component: SettingsScreen },
];

/** Where an empty address ("#/" or none) goes. */
export const HOME_PATH = 'desk';

export interface ScreenMatch {
  screen: ScreenEntry;
  params: Record<string, string>;
}

export function matchScreen(path: string, entries: readonly ScreenEntry[] = screens): ScreenMatch | null {
  const parts = path.split('/').filter(Boolean);
  for (const screen of entries) {
    const pattern = screen.path.split('/').filter(Boolean);
    if (pattern.length !== parts.length) continue;
    const params: Record<string, string> = {};
    const fits = pattern.every((segment, i) => {
      const part = parts[i] ?? '';
      if (segment.startsWith(':')) {
        try {
          params[segment.slice(1)] = decodeURIComponent(part);
        } catch {
          return false;
        }
        return true;
      }
      return segment === part;
    });
    if (fits) return { screen, params };
  }
  return null;
}

/** The navigation entry a path belongs to: "questions/q1" highlights Questions. */
export function navEntryFor(path: string): ScreenEntry | undefined {
  const first = path.split('/')[0] ?? '';
  return screens.find((s) => s.navLabel && s.path.split('/')[0] === first);
}
