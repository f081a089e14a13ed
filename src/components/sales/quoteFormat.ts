/**
 * How the quote screens write money and durations: the one place to swap for the shared format module when it
 * lands.
 */
export { formatCents as formatMoney, formatMinutes } from '../families/formatFigure';
