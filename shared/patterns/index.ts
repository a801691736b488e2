export * from './dates';
export * from './comebacks';
export * from './stats';
export * from './repeats';
export * from './csv';
