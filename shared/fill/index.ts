export * from './fill-gaps';
export * from './fill-ratios';
export * from './solve-harmonic';
