// The Directory's configuration, read from import.meta.env once.
export const appConfig = Object.freeze({
  appName: (import.meta.env.VITE_APP_NAME as string | undefined) ?? 'Emberline',
  /** Same origin: the API is served under /api next to the app (proxied in dev). */
  apiBaseUrl: (import.meta.env.VITE_API_BASE_URL as string | undefined) ?? '',
  consoleUrl: '/console/',
  /** Optional tile server for maps; without it maps draw the offline country outlines. */
  mapTileUrl: (import.meta.env.VITE_MAP_TILE_URL as string | undefined) || undefined,
  mapTileAttribution: (import.meta.env.VITE_MAP_TILE_ATTRIBUTION as string | undefined) || undefined,
});
