export * from './units';
export * from './fuels';
