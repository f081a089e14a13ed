/**
 * The payment provider's published test card numbers that the local fake understands, and what each does.
 * source: the payment provider's testing documentation ("Testing" page, card numbers), 2026, from memory
 */

/** What paying with a card does. */
export type CardOutcome = { ok: true } | { ok: false; code: string; message: string };

const DECLINES: Record<string, { code: string; message: string }> = {
  '4000000000000002': {
    code: 'card_declined',
    message: 'Your card was declined. No money was taken: try another card.',
  },
  '4000000000009995': {
    code: 'insufficient_funds',
    message: 'Your card has insufficient funds. No money was taken: try another card.',
  },
  '4000000000000069': { code: 'expired_card', message: 'Your card has expired. No money was taken: try another card.' },
};

const SUCCEEDS = new Set(['4242424242424242', '5555555555554444', '4000056655665556']);

/**
 * What the fake does with a card number (spaces and dashes ignored).
 * @param cardNumber - the number as typed
 */
export function testCardOutcome(cardNumber: string): CardOutcome {
  const digits = cardNumber.replace(/[\s-]/g, '');
  if (!/^\d{12,19}$/.test(digits) || !luhnValid(digits))
    return { ok: false, code: 'incorrect_number', message: 'Your card number is incorrect. Check it and try again.' };
  if (SUCCEEDS.has(digits)) return { ok: true };
  const decline = DECLINES[digits];
  if (decline) return { ok: false, ...decline };
  return {
    ok: false,
    code: 'test_mode_live_card',
    message: 'This is a test payment page: use the test card 4242 4242 4242 4242. No real card is charged here.',
  };
}

/**
 * The Luhn check digit test (ISO/IEC 7812-1 annex B).
 * @param digits - the card number, digits only
 */
export function luhnValid(digits: string): boolean {
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    let d = Number(digits[digits.length - 1 - i]);
    if (i % 2 === 1) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return sum % 10 === 0;
}
