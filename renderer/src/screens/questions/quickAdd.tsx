/**
 * Opening the quick-add form from anywhere: the "New question" button, N, or Ctrl/Cmd+N.
 * The form lives at the top of the window so the shortcut works on every screen.
 */
import { createContext, useCallback, useContext, useEffect, useMemo, useState, type ReactNode } from 'react';
import { IS_MAC, isTypingTarget } from '../../hooks';
import { navigate, useRoute } from '../../routing';
import { QuickAddDialog } from './QuickAddDialog';

interface QuickAddApi {
  open: () => void;
}

const QuickAddContext = createContext<QuickAddApi | null>(null);

/** For the button's title and aria-keyshortcuts. */
export const QUICK_ADD_SHORTCUT_TEXT = IS_MAC ? 'N or ⌘N' : 'N or Ctrl+N';
export const QUICK_ADD_ARIA_SHORTCUTS = IS_MAC ? 'N Meta+N' : 'N Control+N';

export function QuickAddProvider({ children }: { children: ReactNode }) {
  const [isOpen, setOpen] = useState(false);
  const open = useCallback(() => setOpen(true), []);

  useEffect(() => {
    function onKeyDown(event: KeyboardEvent) {
      if (event.defaultPrevented || event.altKey || event.shiftKey || event.key.toLowerCase() !== 'n') return;
      const withModifier = event.ctrlKey || event.metaKey;
      // A bare "n" is typing when focus is in a field; any open dialog keeps its own keys.
      if (!withModifier && isTypingTarget(event.target)) return;
      if (withModifier && event.ctrlKey && event.metaKey) return;
      if (document.querySelector('dialog[open]')) return;
      event.preventDefault();
      setOpen(true);
    }
    window.addEventListener('keydown', onKeyDown);
    return () => window.removeEventListener('keydown', onKeyDown);
  }, []);

  // The desktop menu's "New question…" (Ctrl/Cmd+N) arrives as the address #/questions?new=1:
  // open the form and take the flag off the address, so Back does not reopen it.
  const route = useRoute();
  const askedForNew = route.query.get('new') === '1';
  useEffect(() => {
    if (!askedForNew) return;
    setOpen(true);
    navigate(route.path);
  }, [askedForNew, route.path]);

  const api = useMemo(() => ({ open }), [open]);
  return (
    <QuickAddContext.Provider value={api}>
      {children}
      <QuickAddDialog open={isOpen} onClose={() => setOpen(false)} />
    </QuickAddContext.Provider>
  );
}

export function useQuickAdd(): QuickAddApi {
  const api = useContext(QuickAddContext);
  if (!api) throw new Error('useQuickAdd was called outside <QuickAddProvider>; wrap the app in it (see App.tsx).');
  return api;
}
