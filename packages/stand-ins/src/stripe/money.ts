/** Currencies whose amounts are whole units, not hundredths. */
const ZERO_DECIMAL = new Set(['bif', 'clp', 'djf', 'gnf', 'jpy', 'kmf', 'krw', 'mga', 'pyg', 'rwf', 'ugx', 'vnd', 'vuv', 'xaf', 'xof', 'xpf']);

export function formatAmount(amount: number, currency: string): string {
  const value = ZERO_DECIMAL.has(currency) ? String(amount) : (amount / 100).toFixed(2);
  return `${value} ${currency.toUpperCase()}`;
}

