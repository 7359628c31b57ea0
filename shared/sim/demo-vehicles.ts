/**
 * Invented demo vehicles for the demo shop and the tests. Their figures are plausible for their
 * class, not taken from any real car.
 */
import { STOICH_AFR } from '../units';
import { tyreDiameterMm } from '../physics/road-speed';
import { BOOSTED_AXES, NA_AXES, type SimVehicle } from './sim-vehicle';

/** A small turbocharged hatchback on gasoline. */
export const DEMO_HATCH: SimVehicle = {
  label: 'Demo hatch 1.6T',
  description: 'Invented 1.6 L turbocharged four-cylinder hatchback on gasoline',
  engine: {
    displacementL: 1.6,
    cylinders: 4,
    fuel: 'gasoline',
    stoichAfr: STOICH_AFR.gasoline,
    injectorCcMin: 440,
  },
  gearing: {
    tireDiameterMm: tyreDiameterMm(205, 55, 16),
    gearRatios: [3.42, 1.95, 1.3, 1.03, 0.84, 0.7],
    finalDrive: 4.06,
  },
  massKg: 1320,
  dragAreaM2: 0.68,
  rollingCoeff: 0.011,
  idleRpm: 850,
  redlineRpm: 6600,
  maxBoostKpa: 95,
  boostOnsetRpm: 1800,
  boostFullRpm: 3200,
  turboLagS: 0.8,
  wotLambda: 0.8,
  veShape: {
    peakVe: 0.95,
    peakRpm: 3600,
    lowSpeedDrop: 0.02,
    highSpeedDrop: 0.014,
    residual: 0.16,
    ripple: 0.025,
    boostPenalty: 0.06,
  },
  ecuError: {
    amplitude: 0.05,
    tilt: 0.03,
    offset: -0.01,
    bumpRpm: 4000,
    bumpMapKpa: 150,
    bumpDepth: -0.09,
  },
  axes: BOOSTED_AXES,
};

/** A light naturally aspirated roadster on gasoline. */
export const DEMO_ROADSTER: SimVehicle = {
  label: 'Demo roadster 2.0',
  description: 'Invented 2.0 L naturally aspirated four-cylinder roadster on gasoline',
  engine: {
    displacementL: 2.0,
    cylinders: 4,
    fuel: 'gasoline',
    stoichAfr: STOICH_AFR.gasoline,
    injectorCcMin: 310,
  },
  gearing: {
    tireDiameterMm: tyreDiameterMm(215, 45, 17),
    gearRatios: [3.14, 1.89, 1.33, 1.0, 0.81],
    finalDrive: 4.1,
  },
  massKg: 1080,
  dragAreaM2: 0.62,
  rollingCoeff: 0.011,
  idleRpm: 800,
  redlineRpm: 7000,
  maxBoostKpa: 0,
  boostOnsetRpm: 0,
  boostFullRpm: 1,
  turboLagS: 0.5,
  wotLambda: 0.87,
  veShape: {
    peakVe: 0.99,
    peakRpm: 4500,
    lowSpeedDrop: 0.014,
    highSpeedDrop: 0.025,
    residual: 0.15,
    ripple: 0.03,
    boostPenalty: 0,
  },
  ecuError: {
    amplitude: 0.06,
    tilt: -0.02,
    offset: 0.015,
    bumpRpm: 4500,
    bumpMapKpa: 90,
    bumpDepth: -0.08,
  },
  axes: NA_AXES,
};

/** A turbocharged five-cylinder estate converted to E85. */
export const DEMO_WAGON: SimVehicle = {
  label: 'Demo wagon 2.5T E85',
  description: 'Invented 2.5 L turbocharged five-cylinder estate running E85',
  engine: {
    displacementL: 2.5,
    cylinders: 5,
    fuel: 'e85',
    stoichAfr: STOICH_AFR.e85,
    injectorCcMin: 1000,
  },
  gearing: {
    tireDiameterMm: tyreDiameterMm(225, 45, 18),
    gearRatios: [3.58, 2.05, 1.35, 1.03, 0.81, 0.67],
    finalDrive: 3.7,
  },
  massKg: 1620,
  dragAreaM2: 0.74,
  rollingCoeff: 0.012,
  idleRpm: 800,
  redlineRpm: 6500,
  maxBoostKpa: 105,
  boostOnsetRpm: 2000,
  boostFullRpm: 3400,
  turboLagS: 1.0,
  wotLambda: 0.78,
  veShape: {
    peakVe: 0.93,
    peakRpm: 3400,
    lowSpeedDrop: 0.018,
    highSpeedDrop: 0.012,
    residual: 0.15,
    ripple: 0.02,
    boostPenalty: 0.07,
  },
  ecuError: {
    amplitude: 0.04,
    tilt: 0.04,
    offset: -0.02,
    bumpRpm: 3600,
    bumpMapKpa: 170,
    bumpDepth: -0.08,
  },
  axes: BOOSTED_AXES,
};

/** All demo vehicles. */
export const DEMO_VEHICLES: readonly SimVehicle[] = [DEMO_HATCH, DEMO_ROADSTER, DEMO_WAGON];
