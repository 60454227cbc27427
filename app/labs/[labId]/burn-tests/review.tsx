import { ReviewQueueScreen } from '@/components/burn/review-queue-screen';

export default function ReviewQueueRoute() {
  return <ReviewQueueScreen />;
}
