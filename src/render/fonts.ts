// The TTF fonts the renderer uses (DejaVu Sans from the `dejavu-fonts-ttf`
// package), registered with pureimage once per process, each on first use.
// Parsing a DejaVu face costs a few hundred milliseconds, so the bold face is
// only loaded when bold text is drawn.
import { createRequire } from 'node:module';
import * as PImage from 'pureimage';

export type FontWeight = 'regular' | 'bold';

const FILES: Record<FontWeight, { file: string; family: string }> = {
  regular: { file: 'DejaVuSans.ttf', family: 'LadderwaveSans' },
  bold: { file: 'DejaVuSans-Bold.ttf', family: 'LadderwaveSansBold' },
};

const loaded = new Set<FontWeight>();

/** Absolute path of a file of the `dejavu-fonts-ttf` package, e.g. "DejaVuSans.ttf". */
export function dejavuPath(file: string): string {
  return createRequire(import.meta.url).resolve(`dejavu-fonts-ttf/ttf/${file}`);
}

/**
 * The pureimage family name of a weight, registering and parsing its TTF on
 * first call. pureimage keeps one font registry per process; this is the only
 * code that touches it.
 */
export function fontFamily(weight: FontWeight = 'regular'): string {
  const f = FILES[weight];
  if (!loaded.has(weight)) {
    PImage.registerFont(dejavuPath(f.file), f.family).loadSync();
    loaded.add(weight);
  }
  return f.family;
}
