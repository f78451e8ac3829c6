/**
 * The theme chosen on the Me tab, kept in this browser. localStorage (not the IndexedDB the cache
 * uses) because it reads synchronously: the page gets its colours before the first paint. A device
 * setting, not the user's: signing out keeps it.
 */
export type ThemePreference = 'system' | 'light' | 'dark';
export const THEME_PREFERENCES: readonly ThemePreference[] = ['system', 'light', 'dark'];
const KEY = 'ampwright:theme';

export const isThemePreference = (v: unknown): v is ThemePreference => THEME_PREFERENCES.includes(v as ThemePreference);

export function readThemePreferenceNow(): ThemePreference | null {
  try {
    const stored = window.localStorage.getItem(KEY);
    return isThemePreference(stored) ? stored : null;
  } catch {
    // storage refused (a private window with storage off): follow the system
    return null;
  }
}

export async function loadThemePreference(): Promise<ThemePreference> {
  return readThemePreferenceNow() ?? 'system';
}

export async function saveThemePreference(preference: ThemePreference): Promise<void> {
  try {
    window.localStorage.setItem(KEY, preference);
  } catch {
    // not kept: the choice still holds until the page is closed
  }
}
