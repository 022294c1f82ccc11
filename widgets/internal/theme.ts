/**
 * The widgets' colours, light and dark. Each is the default of a CSS custom property a host page may
 * override (`--ohmstead-accent: …`). theme.test.ts checks the WCAG 2.2 AA contrast of every pairing the
 * widgets draw: text 4.5:1 (1.4.3), input borders and focus rings 3:1 (1.4.11).
 */
export const palettes = {
  light: {
    bg: '#fffdf9',
    surface: '#f6f1ea',
    fg: '#24211e',
    muted: '#5a544e',
    border: '#847a70',
    accent: '#8f4a1a',
    onAccent: '#ffffff',
    ok: '#1d6637',
    warn: '#7f5200',
    danger: '#a3261b',
    focus: '#1f5fa8',
  },
  dark: {
    bg: '#1e1c1a',
    surface: '#2a2724',
    fg: '#f3efe9',
    muted: '#cbc3ba',
    border: '#978d83',
    accent: '#f0a46b',
    onAccent: '#1e1c1a',
    ok: '#86d6a2',
    warn: '#f2c66d',
    danger: '#ff9d92',
    focus: '#8cc2ff',
  },
} as const;

export type Palette = { [K in keyof (typeof palettes)['light']]: string };

/** `--_name: var(--ohmstead-name, default);` for every colour (names in kebab case: onAccent → on-accent). */
export function paletteCss(p: Palette): string {
  return Object.entries(p)
    .map(([name, value]) => {
      const kebab = name.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`);
      return `--_${kebab}:var(--ohmstead-${kebab},${value});`;
    })
    .join('');
}

/** WCAG 2.x relative luminance of an sRGB colour written #rrggbb. */
export function relativeLuminance(hex: string): number {
  const channel = (i: number) => {
    const c = parseInt(hex.slice(1 + i * 2, 3 + i * 2), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * channel(0) + 0.7152 * channel(1) + 0.0722 * channel(2);
}

/** WCAG 2.x contrast ratio, (L1 + 0.05) / (L2 + 0.05). */
export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x) as [number, number];
  return (hi + 0.05) / (lo + 0.05);
}
