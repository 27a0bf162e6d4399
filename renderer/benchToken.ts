// The browser bench's per-launch token: taken from ?token= once, kept for the tab in sessionStorage.

const KEY = 'ringbench-token';

export function takeToken(location: Location, storage: Storage, history: History): string | null {
  const params = new URLSearchParams(location.search);
  const fromUrl = params.get('token');
  if (fromUrl) {
    storage.setItem(KEY, fromUrl);
    params.delete('token');
    const rest = params.toString();
    // Keep the token out of the address bar, bookmarks and screenshots.
    history.replaceState(null, '', `${location.pathname}${rest ? `?${rest}` : ''}${location.hash}`);
    return fromUrl;
  }
  return storage.getItem(KEY);
}
