/**
 * What the whole window needs to know about the diary (how many questions, its time zone),
 * loaded once and again after every change.
 */
import { createContext, useContext, type ReactNode } from 'react';
import type { DiaryInfo } from '../../shared/contract';
import { systemTimeZone } from '../../shared/time';
import { api } from './api/client';
import { useLoad, type Loaded } from './api/useLoad';

const DiaryInfoContext = createContext<Loaded<DiaryInfo> | null>(null);

export function DiaryInfoProvider({ children }: { children: ReactNode }) {
  const loaded = useLoad(() => api.diaryInfo({}), []);
  return <DiaryInfoContext.Provider value={loaded}>{children}</DiaryInfoContext.Provider>;
}

export function useDiaryInfo(): Loaded<DiaryInfo> {
  const loaded = useContext(DiaryInfoContext);
  if (!loaded) throw new Error('useDiaryInfo was called outside <DiaryInfoProvider>; wrap the app in it (see App.tsx).');
  return loaded;
}

/** The zone new questions start in: the diary's, else this computer's. */
export function useDefaultTimeZone(): string {
  return useDiaryInfo().data?.time_zone ?? systemTimeZone();
}
