import { DomainError } from '../errors';

export type FuelSpec =
  | { kind: 'gasoline' }
  | { kind: 'diesel' }
  | { kind: 'methanol' }
  /** E10, E85 … : ethanol share by volume, 0–100. */
  | { kind: 'ethanol_blend'; ethanolPct: number }
  | { kind: 'custom'; stoichAfr: number };

/**
 * Stoichiometric air-fuel ratios by mass. Gasoline 14.7 and ethanol 9.0: US DOE Alternative Fuels Data Center fuel
 * properties table (a textbook gives 14.6 for CH1.87); diesel and methanol: Heywood, App. D.
 */
export const STOICH_AFR = {
  gasoline: 14.7,
  ethanol: 9.0,
  methanol: 6.47,
  diesel: 14.5,
} as const;

/** Densities used to turn a volume blend into mass fractions, kg/L near 15 °C. */
export const FUEL_DENSITY_KG_PER_L = { ethanol: 0.789, gasoline: 0.745 } as const;

const CUSTOM_AFR_MIN = 2;
const CUSTOM_AFR_MAX = 20;

function assertEthanolPct(pct: number): void {
  if (!Number.isFinite(pct) || pct < 0 || pct > 100) {
    throw new DomainError('validation', `Ethanol share must be between 0 and 100 %, got ${pct}.`);
  }
}

function assertCustomAfr(afr: number): void {
  if (!Number.isFinite(afr) || afr < CUSTOM_AFR_MIN || afr > CUSTOM_AFR_MAX) {
    throw new DomainError(
      'validation',
      `A stoichiometric ratio must be between ${CUSTOM_AFR_MIN} and ${CUSTOM_AFR_MAX}, got ${afr}.`,
    );
  }
}

/** Ethanol mass fraction of a blend given by volume; AFRs mix by mass, not by volume. */
export function ethanolMassFraction(ethanolPct: number): number {
  assertEthanolPct(ethanolPct);
  const ethanolKg = (ethanolPct / 100) * FUEL_DENSITY_KG_PER_L.ethanol;
  const gasolineKg = (1 - ethanolPct / 100) * FUEL_DENSITY_KG_PER_L.gasoline;
  return ethanolKg / (ethanolKg + gasolineKg);
}

export function stoichAfr(fuel: FuelSpec): number {
  switch (fuel.kind) {
    case 'gasoline':
      return STOICH_AFR.gasoline;
    case 'diesel':
      return STOICH_AFR.diesel;
    case 'methanol':
      return STOICH_AFR.methanol;
    case 'ethanol_blend': {
      const w = ethanolMassFraction(fuel.ethanolPct);
      return w * STOICH_AFR.ethanol + (1 - w) * STOICH_AFR.gasoline;
    }
    case 'custom':
      assertCustomAfr(fuel.stoichAfr);
      return fuel.stoichAfr;
  }
}

/** Parses the CLI's `--fuel` value: gasoline | diesel | methanol | e<NN> (e.g. e85) | stoich=<AFR>. */
export function parseFuelOption(text: string): FuelSpec {
  const value = text.trim().toLowerCase();
  if (value === 'gasoline' || value === 'diesel' || value === 'methanol') return { kind: value };
  const blend = /^e(\d{1,3})$/.exec(value);
  if (blend?.[1] !== undefined) {
    const ethanolPct = Number(blend[1]);
    assertEthanolPct(ethanolPct);
    return { kind: 'ethanol_blend', ethanolPct };
  }
  const custom = /^stoich=(\d+(?:\.\d+)?)$/.exec(value);
  if (custom?.[1] !== undefined) {
    const afr = Number(custom[1]);
    assertCustomAfr(afr);
    return { kind: 'custom', stoichAfr: afr };
  }
  throw new DomainError(
    'validation',
    `Unknown fuel "${text}": use gasoline, diesel, methanol, e<NN> such as e85, or stoich=<AFR> such as stoich=14.7.`,
  );
}

function assertPositive(name: string, value: number): void {
  if (!Number.isFinite(value) || value <= 0) {
    throw new DomainError('validation', `${name} must be a positive number, got ${value}.`);
  }
}

export function afrToLambda(afr: number, stoich: number): number {
  assertPositive('Stoichiometric ratio', stoich);
  return afr / stoich;
}

export function lambdaToAfr(lambda: number, stoich: number): number {
  assertPositive('Stoichiometric ratio', stoich);
  return lambda * stoich;
}

/** A short human label: "Gasoline", "E85", "Stoich 14.1". */
export function fuelLabel(fuel: FuelSpec): string {
  switch (fuel.kind) {
    case 'gasoline':
      return 'Gasoline';
    case 'diesel':
      return 'Diesel';
    case 'methanol':
      return 'Methanol';
    case 'ethanol_blend':
      return `E${fuel.ethanolPct}`;
    case 'custom':
      return `Stoich ${fuel.stoichAfr}`;
  }
}
