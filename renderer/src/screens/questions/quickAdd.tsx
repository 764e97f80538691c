/**
 * Opening the quick-add form from anywhere: the "New question" button, N, or Ctrl/Cmd+N.
 * The form lives at the top of the window so the shortcut works on every screen.
 */
import { createContext, useCallback, useContext, useEffect, useMemo, useState, type ReactNode } from 'react';
import { IS_MAC, isTypingTarget } from '../../hooks';
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
