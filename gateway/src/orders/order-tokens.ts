/** The orders module's settings (order-settings.ts), as one injectable value. */
export const ORDER_SETTINGS = Symbol('ORDER_SETTINGS');
