import { Link } from 'react-router-dom';

export default function NotFoundPage() {
  return (
    <div className="py-10">
      <h1 className="text-2xl font-semibold">Nothing here</h1>
      <p className="mt-2 text-slate-700 dark:text-slate-300">This address does not lead to anything in your studios.</p>
      <Link className="mt-4 inline-block font-semibold text-brass-600 underline dark:text-brass-400" to="/">
        Back to your studio
      </Link>
    </div>
  );
}
