import { useParams } from 'react-router';
import { Workspace } from '@client/features/workspace/components/workspace';

export default function SurveyWorkspaceRoute() {
  const { surveyId } = useParams();
  return <Workspace key={surveyId} surveyId={surveyId ?? ''} />;
}
