/**
 * Hash routing: every screen has a deep link (#/s/<id>/log …) that works offline, because the page
 * itself is always the precached index.html.
 */
import { useEffect, useState } from 'preact/hooks';

export type Route =
  | { screen: 'studies'; archived: boolean }
  | { screen: 'new'; from?: string; mode?: 'duplicate' | 'change' }
  | { screen: 'field' | 'log' | 'report'; id: string }
  | { screen: 'demo' }
  | { screen: 'missing'; path: string };

export function parseRoute(hash: string): Route {
  const [path = '', query = ''] = hash.replace(/^#/, '').split('?');
  const q = new URLSearchParams(query);
  const parts = path.split('/').filter(Boolean).map(decodeURIComponent);
  if (parts.length === 0) return { screen: 'studies', archived: q.get('archived') === '1' };
  if (parts[0] === 'new' && parts.length === 1) {
    const from = q.get('from') ?? undefined;
    const mode = q.get('mode');
    return {
      screen: 'new',
      ...(from ? { from } : {}),
      ...(mode === 'duplicate' || mode === 'change' ? { mode } : {}),
    };
  }
  if (parts[0] === 'demo' && parts.length === 1) return { screen: 'demo' };
  if (parts[0] === 's' && parts[1]) {
    const sub = parts[2] ?? 'field';
    if (parts.length <= 3 && (sub === 'field' || sub === 'log' || sub === 'report')) {
      return { screen: sub, id: parts[1] };
    }
  }
  return { screen: 'missing', path };
}

export const href = {
  studies: (archived = false) => (archived ? '#/?archived=1' : '#/'),
  newStudy: (from?: string, mode?: 'duplicate' | 'change') =>
    from ? `#/new?from=${encodeURIComponent(from)}&mode=${mode ?? 'duplicate'}` : '#/new',
  field: (id: string) => `#/s/${encodeURIComponent(id)}`,
  log: (id: string) => `#/s/${encodeURIComponent(id)}/log`,
  report: (id: string) => `#/s/${encodeURIComponent(id)}/report`,
  demo: () => '#/demo',
};

export function go(to: string): void {
  window.location.hash = to.replace(/^#/, '');
}

export function useRoute(): Route {
  const [route, setRoute] = useState(() => parseRoute(window.location.hash));
  useEffect(() => {
    const on = () => setRoute(parseRoute(window.location.hash));
    window.addEventListener('hashchange', on);
    return () => window.removeEventListener('hashchange', on);
  }, []);
  return route;
}
