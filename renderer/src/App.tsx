/**
 * The window: navigation bar, the screen the address names, and the window-wide services
 * (notifications, diary facts, quick add). The desktop shell can ask it to show a question.
 */
import { useEffect, useRef } from 'react';
import { currentToken } from './api/token';
import { EmptyState } from './components/EmptyState';
import { formatCount } from './dates';
import { ToastProvider } from './components/Toast';
import { DiaryInfoProvider } from './diaryInfo';
import { AskFirstProvider } from './forgiving/AskFirst';
import { useDocumentTitle, useTitleCount } from './hooks';
import { hrefTo, navigate, questionPath, useRoute } from './routing';
import { NoTokenPage } from './NoTokenPage';
import { HOME_PATH, matchScreen, navEntryFor, screens } from './screens/registry';
import { useDueCount } from './screens/desk/useDueCount';
import { QuickAddProvider } from './screens/questions/quickAdd';

export function App() {
  useEffect(() => {
    const bridge = window.forelog;
    if (!bridge) return;
    return bridge.onOpenQuestion((id) => navigate(questionPath(id)));
  }, []);

  // Browser mode without the launch token: nothing would load, so say how to get in.
  if (!window.forelog && currentToken() === null) return <NoTokenPage />;

  return (
    <ToastProvider>
      <DiaryInfoProvider>
        <AskFirstProvider>
          <QuickAddProvider>
            <Shell />
          </QuickAddProvider>
        </AskFirstProvider>
      </DiaryInfoProvider>
    </ToastProvider>
  );
}

/** Where a control sits in a table: its table section, row and column. */
interface TablePlace {
  section: HTMLTableSectionElement;
  row: number;
  cell: number;
}

function tablePlace(element: Element | null): TablePlace | null {
  const cell = element?.closest('td, th');
  const row = cell?.parentElement;
  const section = row?.parentElement;
  if (!(cell instanceof HTMLTableCellElement) || !(row instanceof HTMLTableRowElement) || !(section instanceof HTMLTableSectionElement)) return null;
  return { section, row: row.sectionRowIndex, cell: cell.cellIndex };
}

/** The control in the same column of the row now at `place` (the last row, if it was the last), if the table is still there. */
function controlAt(place: TablePlace | null): HTMLElement | null {
  if (!place?.section.isConnected) return null;
  const rows = place.section.rows;
  const row = rows[Math.min(place.row, rows.length - 1)];
  return row?.cells[place.cell]?.querySelector<HTMLElement>('button, a[href], input, select, textarea') ?? null;
}

function Shell() {
  const route = useRoute();
  const path = route.path || HOME_PATH;
  const match = matchScreen(path);
  const current = navEntryFor(path);
  const mainRef = useRef<HTMLElement>(null);
  const firstPath = useRef(path);
  const dueCount = useDueCount() ?? 0;
  useTitleCount(dueCount);

  // An action can take away the control that had focus (Resolve and Reopen swap places once
  // the question reloads): the browser then drops focus onto the page's body, and the next Tab
  // starts from the top of the window. Start the keyboard at the content instead — or, when
  // the control went with its table row (a deleted revision's Delete), at the same control
  // of the row now in its place.
  useEffect(() => {
    const main = mainRef.current;
    if (!main) return;
    let focused: Element | null = null;
    let place: TablePlace | null = null;
    const onFocusIn = (event: FocusEvent) => {
      focused = event.target instanceof Element ? event.target : null;
      place = tablePlace(focused);
    };
    const rescue = new MutationObserver(() => {
      if (focused && !focused.isConnected && (document.activeElement === null || document.activeElement === document.body)) {
        focused = null;
        (controlAt(place) ?? main).focus({ preventScroll: true });
      }
    });
    document.addEventListener('focusin', onFocusIn);
    rescue.observe(main, { childList: true, subtree: true });
    return () => {
      document.removeEventListener('focusin', onFocusIn);
      rescue.disconnect();
    };
  }, []);

  // After moving to another screen, start keyboard and screen-reader users at its content.
  useEffect(() => {
    if (path === firstPath.current) return;
    firstPath.current = '';
    mainRef.current?.focus({ preventScroll: true });
    window.scrollTo(0, 0);
  }, [path]);

  return (
    <>
      <a className="skip-link" href="#main" onClick={(event) => {
        event.preventDefault();
        mainRef.current?.focus();
      }}>
        Skip to content
      </a>
      <header className="app-bar">
        <a className="app-bar__brand" href={hrefTo(HOME_PATH)} aria-label="Forelog, home">
          <span className="app-bar__mark" aria-hidden="true" />
          <span className="app-bar__name">Forelog</span>
        </a>
        <nav aria-label="Main" className="app-bar__nav">
          <ul>
            {screens
              .filter((s) => s.navLabel)
              .map((s) => (
                <li key={s.name}>
                  <a href={hrefTo(s.path)} className="app-bar__link" aria-current={current?.name === s.name ? 'page' : undefined}>
                    {s.navLabel}
                    {s.name === 'desk' && dueCount > 0 ? (
                      <span className="app-bar__count" data-testid="due-count">
                        {formatCount(dueCount)}
                        <span className="visually-hidden"> due</span>
                      </span>
                    ) : null}
                  </a>
                </li>
              ))}
          </ul>
        </nav>
      </header>
      <main id="main" ref={mainRef} tabIndex={-1} className="app-main">
        {match ? <match.screen.component key={match.screen.name} params={match.params} /> : <NotFound />}
      </main>
    </>
  );
}

function NotFound() {
  useDocumentTitle('Not found');
  return (
    <div className="screen">
      <EmptyState title="Nothing lives at this address" actions={<a href={hrefTo(HOME_PATH)}>Go to the Desk</a>}>
        <p>The link may be from an older version of Forelog.</p>
      </EmptyState>
    </div>
  );
}
