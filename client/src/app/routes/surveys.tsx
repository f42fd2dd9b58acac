import { SurveyList } from '@client/features/workspace/components/survey-list';

export default function SurveysRoute() {
  return <SurveyList />;
}
