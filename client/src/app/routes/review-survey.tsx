import { useParams } from 'react-router';
import { ReviewDesk } from '@client/features/review/components/review-desk';

export default function ReviewSurveyRoute() {
  const { surveyId = '' } = useParams();
  return <ReviewDesk key={surveyId} surveyId={surveyId} />;
}
