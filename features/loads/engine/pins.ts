/**
 * Pin checks at a given (peak) load: mean shear stress on the pin's cross-sections, projected bearing
 * pressure on the lug or bushing, and wear against the maker's nominal and minimum diameters.
 */

export type ShearPlanes = 'single' | 'double';

export type PinGeometry = {
  /** Diameter used for stresses: the measured one when known (worn pins are weaker), else nominal. */
  diameterM: number;
  shear: ShearPlanes;
  /** Bearing length t in p = F/(d·t): the lug or bushing thickness carrying the load. */
  bearingLengthM: number;
};

export type PinStresses = {
  forceN: number;
  shearAreaM2: number;
  /** τ = F / (planes · πd²/4): 4F/(πd²) in single shear, 2F/(πd²) in double shear. */
  shearStressPa: number;
  /** p = F / (d·t). */
  bearingPressurePa: number;
};

export function pinStresses(forceN: number, pin: PinGeometry): PinStresses {
  const area = (Math.PI * pin.diameterM * pin.diameterM) / 4;
  const planes = pin.shear === 'double' ? 2 : 1;
  return {
    forceN,
    shearAreaM2: area,
    shearStressPa: forceN / (planes * area),
    bearingPressurePa: forceN / (pin.diameterM * pin.bearingLengthM),
  };
}

export type PinWear = {
  /** Diameter lost since new, nominal − measured. */
  lossM: number;
  /** Share of the wear allowance used: (nominal − measured) / (nominal − minimum). */
  usedRatio: number;
  /** What is left before the minimum, measured − minimum. */
  remainingM: number;
};

export function pinWear(nominalM: number, minimumM: number, measuredM: number): PinWear {
  if (!(nominalM > minimumM)) throw new Error('The nominal diameter must exceed the minimum');
  return {
    lossM: nominalM - measuredM,
    usedRatio: (nominalM - measuredM) / (nominalM - minimumM),
    remainingM: measuredM - minimumM,
  };
}
