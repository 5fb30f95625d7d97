// One file per feature; each is re-exported here so drizzle-kit and the app see one schema.
export * from './accounts';
export * from './mail';
export * from './rooms';
export * from './workshops';
export * from './plans';
export * from './plan-bounds';
