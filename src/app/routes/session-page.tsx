import { Link, useParams } from 'react-router-dom';
import { LoadingBlock } from '../../components/loading-block';
import { Notice } from '../../components/notice';
import { PageHeader } from '../../components/page-header';
import { useSession } from '../../features/sessions/api/get-session';

/** A session: its patch at a glance, until the live editor (its own release) takes this page over. */
export default function SessionPage() {
  const { sessionId = '' } = useParams();
  const session = useSession(sessionId);
  if (session.isPending) return <LoadingBlock label="Loading the session…" />;
  if (session.isError) {
    return (
      <Notice tone="error" title="Cannot open this session">
        {session.error.message}
      </Notice>
    );
  }
  const { patch } = session.data;
  const f0Hz = Math.sqrt(patch.string.tensionN / patch.string.linearDensityKgPerM) / (2 * patch.string.lengthM);
  return (
    <>
      <PageHeader title={session.data.name} subtitle={<Link className="underline" to={`/studios/${session.data.studioId}`}>Back to the sessions</Link>} />
      <Notice>The live editor for this session arrives in the next release. Here is its string as saved.</Notice>
      <dl className="mt-6 grid max-w-xl grid-cols-2 gap-x-6 gap-y-2 text-sm">
        <dt className="font-semibold">Length</dt>
        <dd>{(patch.string.lengthM * 1000).toFixed(1)} mm</dd>
        <dt className="font-semibold">Tension</dt>
        <dd>{patch.string.tensionN.toFixed(2)} N</dd>
        <dt className="font-semibold">Fundamental</dt>
        <dd>{f0Hz.toFixed(2)} Hz</dd>
        <dt className="font-semibold">Pickup</dt>
        <dd>
          {patch.pickup.output} at {(patch.pickup.positionM * 1000).toFixed(1)} mm
        </dd>
        <dt className="font-semibold">Render</dt>
        <dd>
          {patch.render.durationS} s at {patch.render.sampleRateHz / 1000} kHz, up to {patch.render.maxModes} modes
        </dd>
      </dl>
    </>
  );
}
