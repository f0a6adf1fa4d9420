/**
 * React access to the session and to the review worker. Both are injected
 * at the root (App) so component tests pass fakes.
 */
import { createContext, useContext, useSyncExternalStore } from 'react';
import type { Session, SessionSnapshot } from './session';
import type { ReviewApi } from './reviewApi';

export interface Services {
  session: Session;
  review: ReviewApi;
}

export const ServicesContext = createContext<Services | null>(null);

export function useServices(): Services {
  const s = useContext(ServicesContext);
  if (!s) throw new Error('missing ServicesContext provider');
  return s;
}

export function useSessionSnapshot(): SessionSnapshot {
  const { session } = useServices();
  return useSyncExternalStore(session.subscribe, session.getSnapshot, session.getSnapshot);
}
