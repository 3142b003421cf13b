export * from './bus-safety';
export * from './eseries';
export * from './markings';
