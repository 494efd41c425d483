// Shared by the service worker's route and the page.
/** Bump when the worker's caching rules change; older caches are deleted on activation. */
export const SHELL_CACHE = "tracevat-collect-shell-v1";
export const SHELL_PATH = "/collect";
