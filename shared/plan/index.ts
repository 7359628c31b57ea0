export * from './cautions';
export * from './cell-need';
export * from './plan-session';
export * from './plan-types';
export * from './road-gear';
