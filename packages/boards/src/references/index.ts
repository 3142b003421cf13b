export * from './bus-safety';
export * from './eseries';
export * from './markings';
export * from './capacitor-markings';
export * from './decode-marking';
