// Form state for submit-time checks: client errors from the shared zod schema, the server's
// field errors from problem details next to the same fields, anything else in one alert.
import { ref, shallowRef } from 'vue';
import { useI18n } from 'vue-i18n';
import { describeError, problemOf, type ErrorText } from '../errors';

/** What a zod schema's safeParse gives back, typed structurally so the UI needs no zod import. */
export interface SafeParser<O> {
  safeParse(value: unknown):
    | { success: true; data: O }
    | { success: false; error: { issues: ReadonlyArray<{ path: ReadonlyArray<PropertyKey>; message: string }> } };
}

export interface FormAlert extends ErrorText {
  /** The problem's stable code, e.g. EMAIL_NOT_VERIFIED, for forms that offer a next step. */
  code?: string;
}

export function useFormErrors(fields: readonly string[]) {
  const { t } = useI18n();
  const fieldErrors = ref<Record<string, string>>({});
  const alert = shallowRef<FormAlert | null>(null);
  const submitting = ref(false);

  function clear(): void {
    fieldErrors.value = {};
    alert.value = null;
  }

  /** Validates with the schema the API uses; returns the parsed value or null with the errors shown. */
  function check<O>(schema: SafeParser<O>, value: unknown): O | null {
    clear();
    const result = schema.safeParse(value);
    if (result.success) return result.data;
    const next: Record<string, string> = {};
    for (const issue of result.error.issues) {
      const path = issue.path.map(String).join('.');
      next[path] ??= issue.message;
    }
    fieldErrors.value = next;
    return null;
  }

  /** Shows a failed request: field errors beside their fields, the rest as an alert. */
  function fail(error: unknown): void {
    clear();
    const problem = problemOf(error);
    const next: Record<string, string> = {};
    const unplaced: string[] = [];
    for (const e of problem?.errors ?? []) {
      if (fields.includes(e.path)) next[e.path] ??= e.message;
      else unplaced.push(e.message);
    }
    fieldErrors.value = next;
    const placedAll = Object.keys(next).length > 0 && unplaced.length === 0;
    if (!placedAll) {
      const text = describeError(error, t);
      alert.value = { ...text, detail: [text.detail, ...unplaced].filter(Boolean).join(' '), code: problem?.code };
    }
  }

  /** Runs one submission with progress shown; errors land in the form. Resolves true on success. */
  async function run(work: () => Promise<unknown>): Promise<boolean> {
    submitting.value = true;
    try {
      await work();
      return true;
    } catch (error) {
      fail(error);
      return false;
    } finally {
      submitting.value = false;
    }
  }

  /** ant-design-vue FormItem props for one field. */
  function itemProps(field: string): { validateStatus: '' | 'error'; help: string | undefined } {
    const message = fieldErrors.value[field];
    return { validateStatus: message ? 'error' : '', help: message };
  }

  return { fieldErrors, alert, submitting, clear, check, fail, run, itemProps };
}
