import { z } from 'zod';
import { minorToDecimalString, parseMoneyInput } from '@revloop/domain/billing';
import { isDomainError } from '@revloop/domain';
import { PACKAGE_MODULES, packageInputSchema } from '@revloop/domain/jobs';
import type { Package } from '@revloop/contract';

/** A price as typed ("599", "1,250.00"), turned into integer minor units of the shop's currency. */
const moneyField = (currency: string) =>
  z.string().transform((text, ctx) => {
    try {
      return parseMoneyInput(text, currency);
    } catch (error) {
      ctx.addIssue({ code: 'custom', message: isDomainError(error) ? error.message : 'Enter an amount.' });
      return z.NEVER;
    }
  });

/** The package form: prices as text in the form, minor units on the wire, then the domain's own rules. */
export const packageFormSchema = (currency: string) =>
  z
    .object({
      name: z.string(),
      description: z.string().optional(),
      modules: z.array(z.enum(PACKAGE_MODULES)),
      retailPrice: moneyField(currency),
      dealerPrice: moneyField(currency),
      roundsIncluded: z.number('Enter the number of rounds.'),
    })
    .transform(({ retailPrice, dealerPrice, ...rest }) => ({ ...rest, retailPriceMinor: retailPrice, dealerPriceMinor: dealerPrice }))
    .pipe(packageInputSchema);

export type PackageFormValues = z.input<ReturnType<typeof packageFormSchema>>;

/** The form's starting values: empty for a new package, the package's own (prices as decimals) for an edit. */
export function packageFormDefaults(pkg: Package | null, currency: string): PackageFormValues {
  if (!pkg) return { name: '', description: '', modules: ['ECM'], retailPrice: '', dealerPrice: '', roundsIncluded: 3 };
  return {
    name: pkg.name,
    description: pkg.description,
    modules: pkg.modules,
    retailPrice: minorToDecimalString(pkg.retailPriceMinor, currency),
    dealerPrice: minorToDecimalString(pkg.dealerPriceMinor ?? 0, currency),
    roundsIncluded: pkg.roundsIncluded,
  };
}

