import { z } from 'zod';
import { finiteNumber } from './field-rules';
import { parseFields } from './parse-fields';
import { isCalendarDate } from './time-bounds';

/**
 * Amounts in different currencies are never added as they are. A manager who presents one total chooses a
 * reporting currency and enters the exchange rates to use, each with the date it was taken; totals are then
 * given per currency and, where every currency involved has a rate, in the reporting currency too. The rates are
 * stated wherever a converted total appears (review assumptions, CSV).
 */
export interface ExchangeRate {
  /** ISO 4217 code of the currency converted. */
  currency: string;
  /** Units of the reporting currency for one unit of `currency`. */
  rate: number;
  /** The day the rate was taken, YYYY-MM-DD. */
  asOf: string;
}

export interface ReportingCurrency {
  currency: string;
  rates: ExchangeRate[];
}

const code = (label: string) =>
  z
    .string({ error: `${label} is required` })
    .regex(/^[A-Z]{3}$/, { error: `${label} must be a three-letter ISO 4217 code such as EUR` });

export const reportingCurrencySchema = z
  .object({
    currency: code('Reporting currency'),
    rates: z
      .array(
        z.object({
          currency: code('Currency'),
          rate: finiteNumber('Rate')
            .positive({ error: 'Rate must be above zero' })
            .max(1e9, { error: 'Rate is implausibly large' }),
          asOf: z.string({ error: 'Date of the rate is required' }).refine(isCalendarDate, {
            error: 'Date of the rate must be a real date written YYYY-MM-DD'
          })
        })
      )
      .max(200)
  })
  .superRefine((r, ctx) => {
    const seen = new Set<string>();
    r.rates.forEach((x, i) => {
      if (x.currency === r.currency)
        ctx.addIssue({
          code: 'custom',
          path: ['rates', i, 'currency'],
          message: `${x.currency} is the reporting currency itself`
        });
      if (seen.has(x.currency))
        ctx.addIssue({
          code: 'custom',
          path: ['rates', i, 'currency'],
          message: `${x.currency} has two rates; keep one`
        });
      seen.add(x.currency);
    });
  });

export function parseReportingCurrency(input: unknown): ReportingCurrency {
  return parseFields('Reporting currency', reportingCurrencySchema, input);
}

export interface MoneyTotals {
  /** One total per currency, in code order: always available, never converted. */
  byCurrency: { currency: string; perYear: number }[];
  /** The sum in the reporting currency, when one is set and every currency involved has a rate. */
  reporting?: { currency: string; amount: number };
  /** Currencies involved that have no rate (so no reporting total is given). */
  missingRates: string[];
}

/** Totals of amounts per currency, and in the reporting currency where rates allow. */
export function moneyTotals(
  amounts: Iterable<{ amount: number; currency: string }>,
  reporting?: ReportingCurrency
): MoneyTotals {
  const sums = new Map<string, number>();
  for (const { amount, currency } of amounts) sums.set(currency, (sums.get(currency) ?? 0) + amount);
  const byCurrency = [...sums.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([currency, perYear]) => ({ currency, perYear }));
  if (!reporting) return { byCurrency, missingRates: [] };
  let total = 0;
  const missingRates: string[] = [];
  for (const { currency, perYear } of byCurrency) {
    if (currency === reporting.currency) total += perYear;
    else {
      const rate = reporting.rates.find((r) => r.currency === currency)?.rate;
      if (rate === undefined) missingRates.push(currency);
      else total += perYear * rate;
    }
  }
  return {
    byCurrency,
    missingRates,
    ...(missingRates.length === 0 && byCurrency.length > 0
      ? { reporting: { currency: reporting.currency, amount: total } }
      : {})
  };
}

/** The rates as a sentence for assumptions and files: "1 INR = 0.0108 EUR (2026-11-28); …". */
export function ratesStatement(reporting: ReportingCurrency | undefined): string {
  if (!reporting)
    return 'No reporting currency is set: amounts are given per currency and never added across them.';
  if (reporting.rates.length === 0)
    return `Reporting currency ${reporting.currency}; no exchange rates entered.`;
  return `Reporting currency ${reporting.currency}, at the rates entered: ${reporting.rates
    .map((r) => `1 ${r.currency} = ${r.rate} ${reporting.currency} (${r.asOf})`)
    .join('; ')}.`;
}
