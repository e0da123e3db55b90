export * from './shop-settings.schemas';
