/** Masses as people read them. */
import { G_PER_LB } from './units';

/**
 * A mass in grams with one decimal: `612.4 g`.
 * @param g - mass in grams
 */
export function formatMassG(g: number): string {
  return `${g.toFixed(1)} g`;
}

/**
 * A mass in grams (kilograms from 1 kg) with pounds beside it, for documents: `612 g (1.35 lb)`.
 * @param g - mass in grams
 */
export function formatMassGLb(g: number): string {
  const metric = g >= 1000 ? `${(g / 1000).toFixed(2)} kg` : `${Math.round(g)} g`;
  return `${metric} (${(g / G_PER_LB).toFixed(2)} lb)`;
}
