/**
 * What every screen can reach: the store, the user's preferences and the
 * notice area (messages, with an Undo action after a delete).
 */
import { createContext } from 'preact';
import { useContext } from 'preact/hooks';
import type { SurveyStore } from '../../survey/store.ts';
import type { Preferences } from './preferences.ts';

/** A message in the notice area. */
export interface Notice {
  text: string;
  tone: 'info' | 'error';
  /** An action button beside the message, e.g. Undo. */
  action?: { label: string; run: () => Promise<void> | void };
}

export interface AppServices {
  store: SurveyStore;
  preferences: Preferences;
  /** Changes preferences; returns a message when they could not be kept. */
  setPreferences: (change: Partial<Preferences>) => string | null;
  notify: (notice: Notice) => void;
}

export const AppContext = createContext<AppServices | null>(null);

/**
 * The app services; only screens rendered inside the app call this.
 *
 * @example useApp().store //=> the SurveyStore the app opened
 */
export function useApp(): AppServices {
  const services = useContext(AppContext);
  if (!services) throw new Error('Lampwalk: a screen was rendered outside the app');
  return services;
}
