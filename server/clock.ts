/**
 * The one system clock on the server. main.ts puts it into AppContext as `clock`, and the command
 * line passes it to its commands; everything else takes the time from the clock it is given, so a
 * test can fix it. ESLint bans a bare `new Date()` and `Date.now()` elsewhere in server/.
 */
export const systemClock = (): Date => new Date();
