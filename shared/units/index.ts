export * from './units';
export * from './fuels';
export * from './obd';
