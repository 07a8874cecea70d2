import { Navigate } from 'react-router-dom';
import { useMe } from '../../lib/queries/get-me';
import { currentStudio } from '../../features/studios/current-studio';

/** `/`: the last studio used, or the first, or a prompt to create one. */
export default function HomeRedirect() {
  const me = useMe();
  if (!me.data) return null;
  const studio = currentStudio(me.data, undefined);
  return <Navigate to={studio ? `/studios/${studio.id}` : '/studios/new'} replace />;
}
