/**
 * Which theme is on: the system's setting (`useColorScheme`: `prefers-color-scheme` on the web)
 * unless the Me tab chose light or dark. On the web the colours follow at once (CSS variables,
 * theme.ts); `palette` gives the plain values for props that cannot take a variable (the header's
 * tint, which the back arrow image is filtered with).
 */
import { createContext, useCallback, useContext, useEffect, useMemo, useState } from 'react';
import { useColorScheme } from 'react-native';
import { applyScheme, PALETTES, resolveScheme, type ColourScheme, type ColourToken } from './theme';
import { loadThemePreference, readThemePreferenceNow, saveThemePreference, type ThemePreference } from './theme-preference';

interface ThemeState {
  preference: ThemePreference;
  scheme: ColourScheme;
  palette: Record<ColourToken, string>;
  choose: (preference: ThemePreference) => void;
}

const ThemeContext = createContext<ThemeState>({
  preference: 'system',
  scheme: 'light',
  palette: PALETTES.light,
  choose: () => undefined,
});

export function ThemeProvider({ children }: { children: React.ReactNode }) {
  const system = useColorScheme();
  const [preference, setPreference] = useState<ThemePreference>(() => readThemePreferenceNow() ?? 'system');
  useEffect(() => {
    void loadThemePreference().then(setPreference);
  }, []);
  const scheme = resolveScheme(preference, system);
  useEffect(() => applyScheme(scheme), [scheme]);
  const choose = useCallback((next: ThemePreference) => {
    setPreference(next);
    void saveThemePreference(next);
  }, []);
  const value = useMemo(() => ({ preference, scheme, palette: PALETTES[scheme], choose }), [preference, scheme, choose]);
  return <ThemeContext.Provider value={value}>{children}</ThemeContext.Provider>;
}

export const useTheme = () => useContext(ThemeContext);
