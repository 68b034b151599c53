/** Code of the error csrf-sync raises, recognised by the error middleware. */
export const CSRF_ERROR_CODE = 'EBADCSRFTOKEN';
