export * from './dtc-format';
export * from './dtc-classify';
export * from './misfire';
export * from './dtc-text';
export * from './failure-type';
export * from './j1979';
export * from './uds-status';
export * from './code-reference';
