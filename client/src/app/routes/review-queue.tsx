import { ReviewQueue } from '@client/features/review/components/review-queue';

export default function ReviewQueueRoute() {
  return <ReviewQueue />;
}
