// Page data as { data, loading, error, refresh }: the shape every list screen builds on.
import { onScopeDispose, ref, shallowRef, type Ref, type ShallowRef } from 'vue';

export interface AsyncData<T> {
  data: ShallowRef<T | null>;
  loading: Ref<boolean>;
  error: ShallowRef<unknown>;
  refresh: () => Promise<void>;
}

export function useAsyncData<T>(loader: (signal: AbortSignal) => Promise<T>, options: { immediate?: boolean } = {}): AsyncData<T> {
  const data = shallowRef<T | null>(null);
  const loading = ref(false);
  const error = shallowRef<unknown>(null);
  let controller: AbortController | null = null;

  async function refresh(): Promise<void> {
    controller?.abort();
    const current = new AbortController();
    controller = current;
    loading.value = true;
    error.value = null;
    try {
      const result = await loader(current.signal);
      if (controller === current) data.value = result;
    } catch (err) {
      if (controller === current && (err as Error)?.name !== 'AbortError') error.value = err;
    } finally {
      if (controller === current) loading.value = false;
    }
  }

  onScopeDispose(() => controller?.abort());
  if (options.immediate !== false) void refresh();
  return { data, loading, error, refresh };
}
