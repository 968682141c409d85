import { createContext, useContext, useMemo, useRef } from 'react';
import type { ReactNode } from 'react';
import { Toast } from 'primereact/toast';

export interface Notify {
  success: (summary: string, detail?: string) => void;
  error: (summary: string, detail?: string) => void;
  info: (summary: string, detail?: string) => void;
}

const NotifyContext = createContext<Notify | null>(null);

/** One toast area for the whole app; features call useNotify() after something worked (or did not). */
export function NotifyProvider({ children }: { children: ReactNode }) {
  const toast = useRef<Toast>(null);
  const notify = useMemo<Notify>(() => {
    const show =
      (severity: 'success' | 'error' | 'info', life: number) => (summary: string, detail?: string) =>
        toast.current?.show({ severity, summary, detail, life });
    return { success: show('success', 4000), error: show('error', 8000), info: show('info', 4000) };
  }, []);
  return (
    <NotifyContext.Provider value={notify}>
      {children}
      <Toast ref={toast} position="top-right" className="app-toast" />
    </NotifyContext.Provider>
  );
}

export function useNotify(): Notify {
  const value = useContext(NotifyContext);
  if (!value) throw new Error('useNotify() needs <NotifyProvider> above it.');
  return value;
}
