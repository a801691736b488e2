export * from './monitors';
export * from './read-text';
export * from './verdict';
export * from './view';
export * from './drive-cycles';
