/**
 * Where the session store keeps the signed-in user on the phone. A module of its own because the
 * page's early request (src/early/) reads them before the app, and must not bundle Pinia or Vue.
 */
export const TOKEN_STORAGE_KEY = 'chalkline.token'
export const USER_STORAGE_KEY = 'chalkline.user'
