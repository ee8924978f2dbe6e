// One application as a network admin reviews it: the application, checklist, notes and history.
import { watch, type Ref } from 'vue';
import { useAsyncData } from '@emberline/ui';
import { getApplicationReview, type ApplicationReview } from '@/api/onboarding';

export function useApplicationReview(orgId: Ref<string>) {
  const review = useAsyncData<ApplicationReview>((signal) => getApplicationReview(orgId.value, signal));
  watch(orgId, () => void review.refresh());
  return review;
}
