import { type VeTable } from '../core/table';
import { airMassFlowGps } from './air-mass';
import { assumedPowerLambda, cellPhysics } from './cell-physics';
import { type EngineSpec } from './vehicle-spec';

const engine: EngineSpec = {
  displacementL: 2.0,
  cylinders: 4,
  fuel: 'gasoline',
  stoichAfr: 14.7,
  injectorCcMin: 440,
};

const table: VeTable = {
  rpmAxis: [1000, 3000, 6500],
  mapAxisKpa: [30, 100, 200],
  values: [
    [45, 60, 55],
    [80, 85, 90],
    [85, 95, 100],
  ],
};

describe('cellPhysics', () => {
  it('When given a table, then each cell holds the speed-density airflow of its VE', () => {
    // computed from the formulas (reference.md §1) [C]
    const result = cellPhysics(table, engine);
    expect(result.airflowGps.data[1 * 3 + 1]).toBeCloseTo(
      airMassFlowGps(0.85, 100, 25, 2, 3000),
      9,
    );
  });

  it('When the worked-example cell is fuelled at λ 1, then its duty is 15.458 %', () => {
    // computed from the formulas: 33.78 mg / (440·0.745/60 mg/ms) over a 40 ms cycle [C]
    const result = cellPhysics(table, engine, { lambdaCmd: 1 });
    expect(result.dutyPct.data[1 * 3 + 1]).toBeCloseTo(15.458, 3);
  });

  it('When high boost at high rpm needs more than the injectors give, then the cell is critical', () => {
    const result = cellPhysics(table, { ...engine, injectorCcMin: 250 });
    expect(result.levels[2]?.[2]).toBe('critical');
    expect(result.levels[0]?.[0]).toBe('ok');
    expect(result.hasWarning).toBe(true);
  });

  it('When the injectors are ample, then no cell warns', () => {
    expect(cellPhysics(table, { ...engine, injectorCcMin: 2000 }).hasWarning).toBe(false);
  });

  it('When the input is given, then it is not changed', () => {
    const copy = JSON.parse(JSON.stringify(table)) as VeTable;
    cellPhysics(table, engine);
    expect(table).toEqual(copy);
  });

  it('When the engine has no cylinders, then it throws naming the field', () => {
    expect(() => cellPhysics(table, { ...engine, cylinders: 0 })).toThrow('engine.cylinders');
  });
});

describe('assumedPowerLambda', () => {
  it.each([
    [40, 1],
    [80, 1],
    [90, 0.9],
    [100, 0.8],
    [180, 0.8],
  ])('When MAP is %p kPa, then the assumed lambda is %p', (map, lambda) => {
    expect(assumedPowerLambda(3000, map)).toBeCloseTo(lambda, 12);
  });
});
