// Component tests start as a browser that holds a session hint (the readable cookie the API sets
// beside the httpOnly refresh cookie), so stores ask their mocked API to restore a session.
import { beforeEach } from 'vitest';

beforeEach(() => {
  document.cookie = 'emberline_session=1; path=/';
});
