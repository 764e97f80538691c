/**
 * The Questions list, fetched a page at a time as it scrolls into view. The first page of a
 * new query (a keystroke in the search box, a filter, an order, a change to the diary) says
 * how many questions match; later pages come when the rows they hold are about to be drawn.
 *
 * Typing never queues a request per keystroke: at most one first page is on its way; when it
 * arrives and the query has moved on meanwhile, it is dropped and the newest query asked for.
 * Until the new first page arrives the list keeps showing the last one (marked busy).
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import type { QuestionList, Request, TagCount } from '../../../../shared/contract';
import type { QuestionSummary } from '../../../../shared/domain';
import { api } from '../../api/client';
import { useDiaryVersion } from '../../api/changes';

export const PAGE_SIZE = 100;

export interface QuestionPages {
  /** The query the rows belong to (its key), or null before the first answer. */
  key: string | null;
  matched: number;
  total: number;
  tags: TagCount[];
  /** The row at `index`, or undefined while its page loads. */
  rowAt: (index: number) => QuestionSummary | undefined;
  /** Asks for the pages holding rows `first`…`last` (call with what is on screen). */
  want: (first: number, last: number) => void;
  /** A request for the current query is on its way. */
  loading: boolean;
  error: unknown;
  retry: () => void;
}

interface Shown {
  key: string;
  request: Request<'listQuestions'>;
  matched: number;
  total: number;
  tags: TagCount[];
  pages: Map<number, QuestionSummary[]>;
}

export function useQuestionPages(request: Request<'listQuestions'>): QuestionPages {
  const version = useDiaryVersion();
  const [attempt, setAttempt] = useState(0);
  const key = `${JSON.stringify(request)}#${version}#${attempt}`;
  const [shown, setShown] = useState<Shown | null>(null);
  const [error, setError] = useState<unknown>(undefined);
  const wanted = useRef({ key, request });
  wanted.current = { key, request };
  const inFlight = useRef<string | null>(null);
  const pageRequests = useRef(new Set<string>());

  const askFirst = useCallback(() => {
    if (inFlight.current !== null) return;
    const { key: asked, request: req } = wanted.current;
    inFlight.current = asked;
    api.listQuestions({ ...req, offset: 0, limit: PAGE_SIZE }).then(
      (list: QuestionList) => {
        inFlight.current = null;
        if (wanted.current.key !== asked) {
          askFirst();
          return;
        }
        setError(undefined);
        setShown({ key: asked, request: req, matched: list.matched, total: list.total, tags: list.tags, pages: new Map([[0, list.questions]]) });
      },
      (failure: unknown) => {
        inFlight.current = null;
        if (wanted.current.key !== asked) askFirst();
        else setError(failure);
      },
    );
  }, []);

  useEffect(() => {
    setError(undefined);
    askFirst();
  }, [key, askFirst]);

  const want = useCallback(
    (first: number, last: number) => {
      const current = shown;
      if (!current || current.key !== wanted.current.key) return;
      for (let page = Math.floor(first / PAGE_SIZE); page <= Math.floor(last / PAGE_SIZE); page++) {
        const id = `${current.key}|${page}`;
        if (current.pages.has(page) || pageRequests.current.has(id) || page * PAGE_SIZE >= current.matched) continue;
        pageRequests.current.add(id);
        api.listQuestions({ ...current.request, offset: page * PAGE_SIZE, limit: PAGE_SIZE }).then(
          (list) => {
            pageRequests.current.delete(id);
            setShown((s) => (s && s.key === current.key ? { ...s, pages: new Map(s.pages).set(page, list.questions) } : s));
          },
          (failure: unknown) => {
            pageRequests.current.delete(id);
            setError(failure);
          },
        );
      }
    },
    [shown],
  );

  const rowAt = useCallback(
    (index: number) => shown?.pages.get(Math.floor(index / PAGE_SIZE))?.[index % PAGE_SIZE],
    [shown],
  );

  return {
    key: shown?.key ?? null,
    matched: shown?.matched ?? 0,
    total: shown?.total ?? 0,
    tags: shown?.tags ?? [],
    rowAt,
    want,
    loading: shown?.key !== key && error === undefined,
    error,
    retry: useCallback(() => setAttempt((n) => n + 1), []),
  };
}
