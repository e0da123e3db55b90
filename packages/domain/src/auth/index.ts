export * from './roles';
export * from './ability';
export * from './password-policy';
