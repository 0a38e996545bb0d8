// Light/dark theme: an explicit choice is saved in localStorage; without one the app follows the
// system's prefers-color-scheme, live. index.html applies the same rule before the first paint.
import { useSyncExternalStore } from 'react';

export type Theme = 'light' | 'dark';

export const THEME_STORAGE_KEY = 'orbitab.theme';

const systemDark = () => window.matchMedia('(prefers-color-scheme: dark)');
const listeners = new Set<() => void>();

function savedTheme(): Theme | null {
  try {
    const value = localStorage.getItem(THEME_STORAGE_KEY);
    return value === 'light' || value === 'dark' ? value : null;
  } catch {
    return null; // storage blocked (private mode, policy): fall back to the system setting
  }
}

export function currentTheme(): Theme {
  return savedTheme() ?? (systemDark().matches ? 'dark' : 'light');
}

function apply() {
  document.documentElement.dataset.theme = currentTheme();
  for (const listener of listeners) listener();
}

export function setTheme(theme: Theme) {
  try {
    localStorage.setItem(THEME_STORAGE_KEY, theme);
  } catch {
    // Not persisted, but still applied for this page.
    document.documentElement.dataset.theme = theme;
    for (const listener of listeners) listener();
    return;
  }
  apply();
}

/** Starts following system changes (when no explicit choice) and other tabs' choices. Call once. */
export function watchTheme() {
  apply();
  systemDark().addEventListener('change', () => {
    if (!savedTheme()) apply();
  });
  window.addEventListener('storage', (e) => {
    if (e.key === THEME_STORAGE_KEY) apply();
  });
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export function useTheme(): Theme {
  return useSyncExternalStore(subscribe, () => (document.documentElement.dataset.theme === 'dark' ? 'dark' : 'light'));
}
