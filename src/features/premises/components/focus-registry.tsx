/**
 * Keyboard-first building: after a floor is added the cursor goes to its first room, after a
 * room to its first opening. The field to focus next may not exist yet (it appears when the
 * premises come back from the server), so a focus request waits until a field with that key mounts.
 */
import { createContext, useCallback, useContext, useMemo, useRef, type ReactNode } from 'react';

interface FocusRegistry {
  /** a ref callback that records the element under `key` (and focuses it if it was asked for) */
  register: (key: string) => (el: HTMLElement | null) => void;
  /** focus the element under `key` now, or as soon as it mounts */
  request: (key: string) => void;
}

const Context = createContext<FocusRegistry | null>(null);

export const focusKeys = {
  newFloor: 'floor:new',
  newRoom: (floorId: string) => `room:new:${floorId}`,
  newOpening: (roomId: string) => `opening:new:${roomId}`,
  openingButton: (roomId: string) => `opening:button:${roomId}`,
  item: (id: string) => `item:${id}`,
};

export function FocusRegistryProvider({ children }: { children: ReactNode }) {
  const elements = useRef(new Map<string, HTMLElement>());
  const callbacks = useRef(new Map<string, (el: HTMLElement | null) => void>());
  const pending = useRef<string | null>(null);

  const register = useCallback((key: string) => {
    let callback = callbacks.current.get(key);
    if (!callback) {
      callback = (el: HTMLElement | null) => {
        if (el) {
          elements.current.set(key, el);
          if (pending.current === key) {
            pending.current = null;
            el.focus();
          }
        } else elements.current.delete(key);
      };
      callbacks.current.set(key, callback);
    }
    return callback;
  }, []);

  const request = useCallback((key: string) => {
    const el = elements.current.get(key);
    if (el && el.isConnected) {
      pending.current = null;
      el.focus();
    } else pending.current = key;
  }, []);

  const value = useMemo(() => ({ register, request }), [register, request]);
  return <Context.Provider value={value}>{children}</Context.Provider>;
}

export function useFocusRegistry(): FocusRegistry {
  const ctx = useContext(Context);
  if (!ctx) throw new Error('useFocusRegistry needs FocusRegistryProvider');
  return ctx;
}
