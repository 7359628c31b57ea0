/**
 * Fuels and their stoichiometric air-fuel ratio by mass, and conversions between lambda, AFR
 * and equivalence ratio φ (λ = AFR / AFR_st, φ = 1 / λ).
 */

/** Fuels the product knows, plus `custom` (the user gives the ratio). */
export const FUELS = ['gasoline', 'e10', 'e85', 'ethanol', 'methanol', 'custom'] as const;
/** One fuel. */
export type Fuel = (typeof FUELS)[number];

/**
 * Stoichiometric AFR of a fuel CH_yO_z by mass: 34.56 (4 + y − 2z) / (12.011 + 1.008 y + 16 z),
 * from the oxygen balance of complete combustion (air 23.2 % oxygen by mass).
 */
export function stoichiometricAfr(y: number, z: number): number {
  if (!(y > 0) || !(z >= 0)) throw new Error('stoichiometricAfr: y must be > 0 and z ≥ 0');
  return (34.56 * (4 + y - 2 * z)) / (12.011 + 1.008 * y + 16 * z);
}

/** Stoichiometric AFR of a blend: the mass-weighted mean of its parts. */
export function blendAfr(parts: readonly { massFraction: number; afr: number }[]): number {
  const total = parts.reduce((sum, p) => sum + p.massFraction, 0);
  if (Math.abs(total - 1) > 1e-9) throw new Error('blendAfr: mass fractions must add up to 1');
  return parts.reduce((sum, p) => sum + p.massFraction * p.afr, 0);
}

/**
 * The stoichiometric AFR the product uses for each fuel. Gasoline uses the trade's 14.7 (the
 * CH1.87 formula gives 14.60; handbooks quote 14.6 to 14.7); ethanol and methanol come from the
 * formula; E10 and E85 are mass-weighted blends with gasoline at 14.7 and ethanol mass
 * fractions 0.105 and 0.857 (0.789 and 0.745 kg/L).
 */
export const STOICH_AFR: Readonly<Record<Exclude<Fuel, 'custom'>, number>> = (() => {
  const gasoline = 14.7;
  const ethanol = stoichiometricAfr(3, 0.5);
  return {
    gasoline,
    e10: blendAfr([
      { massFraction: 0.895, afr: gasoline },
      { massFraction: 0.105, afr: ethanol },
    ]),
    e85: blendAfr([
      { massFraction: 0.143, afr: gasoline },
      { massFraction: 0.857, afr: ethanol },
    ]),
    ethanol,
    methanol: stoichiometricAfr(4, 1),
  };
})();

/** Lambda from an air-fuel ratio and the fuel's stoichiometric ratio. */
export function lambdaFromAfr(afr: number, stoichAfr: number): number {
  return afr / stoichAfr;
}

/** Air-fuel ratio from lambda and the fuel's stoichiometric ratio. */
export function afrFromLambda(lambda: number, stoichAfr: number): number {
  return lambda * stoichAfr;
}

/** Lambda from the equivalence ratio φ (fuel-air relative to stoichiometric). */
export function lambdaFromPhi(phi: number): number {
  return 1 / phi;
}

/** The equivalence ratio φ from lambda. */
export function phiFromLambda(lambda: number): number {
  return 1 / lambda;
}
