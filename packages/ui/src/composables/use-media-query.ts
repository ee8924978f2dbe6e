// A reactive CSS media query, for layouts that change shape on phones.
import { onScopeDispose, ref, type Ref } from 'vue';

export function useMediaQuery(query: string): Ref<boolean> {
  const matches = ref(false);
  if (typeof window === 'undefined' || typeof window.matchMedia !== 'function') return matches;
  const list = window.matchMedia(query);
  matches.value = list.matches;
  const onChange = (event: MediaQueryListEvent) => (matches.value = event.matches);
  list.addEventListener('change', onChange);
  onScopeDispose(() => list.removeEventListener('change', onChange));
  return matches;
}
