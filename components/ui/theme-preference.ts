/**
 * The theme chosen on the Me tab (system / light / dark), kept on the device. Native: AsyncStorage,
 * read after start (the colours were taken from the system when the app started). The web build
 * uses theme-preference.web.ts (localStorage, read before the first paint).
 */
import AsyncStorage from '@react-native-async-storage/async-storage';

export type ThemePreference = 'system' | 'light' | 'dark';
export const THEME_PREFERENCES: readonly ThemePreference[] = ['system', 'light', 'dark'];
const KEY = 'ampwright:theme';

export const isThemePreference = (v: unknown): v is ThemePreference => THEME_PREFERENCES.includes(v as ThemePreference);

/** Not readable synchronously on a phone. */
export function readThemePreferenceNow(): ThemePreference | null {
  return null;
}

export async function loadThemePreference(): Promise<ThemePreference> {
  const stored = await AsyncStorage.getItem(KEY).catch(() => null);
  return isThemePreference(stored) ? stored : 'system';
}

export async function saveThemePreference(preference: ThemePreference): Promise<void> {
  await AsyncStorage.setItem(KEY, preference).catch(() => undefined);
}
