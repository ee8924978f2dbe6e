// The one way users see errors: problem details turned into words, shown with ant-design-vue.
import { notification } from 'ant-design-vue';
import type { ProblemDetails } from '@emberline/domain';

type Translate = (key: string, named?: Record<string, unknown>) => string;

export interface ErrorText {
  title: string;
  detail: string;
  requestId?: string;
}

/** The RFC 9457 problem carried by an ApiError, without depending on the client package. */
export function problemOf(error: unknown): ProblemDetails | null {
  if (error && typeof error === 'object' && 'problem' in error) {
    const problem = (error as { problem: unknown }).problem;
    if (problem && typeof problem === 'object' && 'title' in problem && 'status' in problem) return problem as ProblemDetails;
  }
  return null;
}

export function describeError(error: unknown, t: Translate): ErrorText {
  const problem = problemOf(error);
  if (problem?.code === 'NETWORK_ERROR') return { title: t('common.errorTitle'), detail: t('errors.network') };
  if (problem && problem.status < 500) {
    return { title: problem.title, detail: problem.detail ?? '', requestId: problem.requestId };
  }
  return { title: t('common.errorTitle'), detail: t('errors.unexpected'), requestId: problem?.requestId };
}

/** A notification for failures the user did not see in place (e.g. after submitting). */
export function showError(error: unknown, t: Translate): void {
  const text = describeError(error, t);
  notification.error({
    message: text.title,
    description: text.requestId ? `${text.detail} ${t('errors.reference', { id: text.requestId })}` : text.detail,
  });
}
