export * from './air-mass';
export * from './cell-physics';
export * from './check-number';
export * from './injector-duty';
export * from './road-speed';
export * from './vehicle-spec';
