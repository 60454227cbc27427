/** Family names: registered with expo-font on a phone (fonts.ts), by @font-face in public/index.html on the web. */
export const fontFaces = {
  regular: 'Source Sans 3',
  semibold: 'Source Sans 3 SemiBold',
  bold: 'Source Sans 3 Bold',
} as const;
