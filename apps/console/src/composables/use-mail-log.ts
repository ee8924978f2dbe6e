// Outgoing e-mail for network admins, filtered by status and recipient.
import { reactive, watch } from 'vue';
import type { MailLogEntry } from '@emberline/domain';
import { useAsyncData } from '@emberline/ui';
import { listMailLog } from '@/api/admin';

export interface MailLogFilters {
  status: MailLogEntry['status'] | '';
  to: string;
}

export function useMailLog() {
  const filters = reactive<MailLogFilters>({ status: '', to: '' });
  const log = useAsyncData<MailLogEntry[]>((signal) =>
    listMailLog({ status: filters.status || undefined, to: filters.to.trim() || undefined, limit: 200 }, signal),
  );
  watch(
    () => filters.status,
    () => void log.refresh(),
  );
  return { ...log, filters };
}
