import { useRef } from 'react';
import { useSearchParams } from 'react-router';

/**
 * Search parameters as list filters. A change builds on the previous change while the URL has not
 * caught up with it yet, so two quick changes (a status, then a mark) both stay in the URL.
 */
export function useUrlParams(): [URLSearchParams, (change: (next: URLSearchParams) => void) => void] {
  const [sp, setSp] = useSearchParams();
  const pending = useRef<{ base: string; params: URLSearchParams } | null>(null);
  const update = (change: (next: URLSearchParams) => void): void => {
    const current = sp.toString();
    const base = pending.current && pending.current.base === current ? pending.current.params : sp;
    const next = new URLSearchParams(base);
    change(next);
    pending.current = { base: current, params: next };
    setSp(next, { replace: true });
  };
  return [sp, update];
}
