// Search results for the request in the URL as { data, loading, error, refresh }, plus the fields
// the request itself got wrong (checked with the API's schema before sending, or the server's 400).
import { computed, watch, type Ref } from 'vue';
import { SearchQuerySchema, type SearchRequest, type SearchResponse } from '@emberline/domain';
import { problemOf, useAsyncData } from '@emberline/ui';
import { searchPartners } from '@/api/search';
import { fieldOfPath } from './use-search-query';

/** Field → message for each value the API's schema refuses; empty when the request is fine. */
export function checkSearchRequest(r: SearchRequest | null): Record<string, string> {
  if (!r) return {};
  const parsed = SearchQuerySchema.safeParse(r);
  if (parsed.success) return {};
  const out: Record<string, string> = {};
  for (const issue of parsed.error.issues) out[fieldOfPath(issue.path.map(String).join('.'))] ??= issue.message;
  return out;
}

export function useSearch(request: Ref<SearchRequest | null>) {
  /** A request the schema refuses is not sent; its fields show the reasons. */
  const invalid = computed(() => checkSearchRequest(request.value));

  const result = useAsyncData<SearchResponse | null>(async (signal) => {
    const r = request.value;
    if (!r || Object.keys(invalid.value).length) return null;
    return searchPartners(r, signal);
  }, { immediate: false });

  const key = computed(() => JSON.stringify(request.value));
  watch(key, () => void result.refresh(), { immediate: true });

  /** Field errors to show beside the form: the schema's, else those of a server 400. */
  const fieldErrors = computed<Record<string, string>>(() => {
    if (Object.keys(invalid.value).length) return invalid.value;
    const out: Record<string, string> = {};
    for (const e of problemOf(result.error.value)?.errors ?? []) out[fieldOfPath(e.path)] ??= e.message;
    return out;
  });

  return { ...result, fieldErrors };
}
