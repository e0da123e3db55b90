export * from './roles';
export * from './ability';
export * from './system-actor';
export * from './password-policy';
