import { fontFaces } from './font-faces';
import { Platform } from 'react-native';

// Quenchbook's own palette: dark ink on warm paper for reading outdoors on a phone, one teal
// for actions and an amber that marks where you are. Text pairs meet WCAG AA (most AAA).
export const colors = {
  ink: '#0F1A24',
  paper: '#F7F5F0',
  surface: '#FFFFFF',
  line: '#C9C4B8',
  muted: '#44505B',
  primary: '#0B5563',
  onPrimary: '#FFFFFF',
  caution: '#8A3A00',
  cautionBg: '#FFF1E0',
  danger: '#A11D2B',
  ok: '#1D6B3A',
  navBg: '#0F1A24',
  navText: '#E9E6DF',
  navActiveBg: '#F2B544',
  navActiveText: '#0F1A24',
} as const;

export const space = { xs: 4, sm: 8, md: 12, lg: 16, xl: 24, xxl: 32 } as const;

export const radius = { sm: 6, md: 10 } as const;

export { fontFaces };

// In CSS an unquoted family name may not contain a word that starts with a digit ("3"), so on
// the web the names go into styles quoted, with a fallback.
const family = (name: string) =>
  Platform.OS === 'web' ? `"${name}", "Source Sans Pro", sans-serif` : name;

export const fonts = {
  regular: family(fontFaces.regular),
  semibold: family(fontFaces.semibold),
  bold: family(fontFaces.bold),
} as const;

export const type = {
  title: { fontFamily: fonts.bold, fontSize: 30, lineHeight: 36 },
  heading: { fontFamily: fonts.semibold, fontSize: 22, lineHeight: 28 },
  body: { fontFamily: fonts.regular, fontSize: 17, lineHeight: 24 },
  label: { fontFamily: fonts.semibold, fontSize: 15, lineHeight: 20 },
  small: { fontFamily: fonts.regular, fontSize: 14, lineHeight: 19 },
} as const;

export type TypeVariant = keyof typeof type;

/** Below this window width the shell uses bottom tabs; at or above it, a side bar. */
export const WIDE_BREAKPOINT = 700;
