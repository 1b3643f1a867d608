/** The store: the only place SQL lives. One module per group of tables (see each file). */
export * from './audit';
export * from './batches';
export * from './demand';
export * from './dump';
export * from './items';
export * from './migrations';
export * from './overrides';
export * from './settings';
export * from './stock';
export * from './store';
