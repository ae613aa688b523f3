export * from './status';
export * from './target-units';
