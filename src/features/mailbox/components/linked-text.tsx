import { Link } from 'react-router-dom';
import { appPath, splitLinks } from '../local-links';

const linkClass = 'break-all font-semibold text-brass-600 underline focus-visible:outline-2 focus-visible:outline-teal-400 dark:text-brass-400';

/** Mail text with every address clickable: links into this app open in it, others in a new tab. */
export function LinkedText({ text }: { text: string }) {
  const origin = window.location.origin;
  return (
    <>
      {splitLinks(text).map((part, index) => {
        if (part.kind === 'text') return <span key={index}>{part.text}</span>;
        const path = appPath(part.href, origin, import.meta.env.DEV);
        return path ? (
          <Link key={index} to={path} className={linkClass}>
            {part.href}
          </Link>
        ) : (
          <a key={index} href={part.href} target="_blank" rel="noreferrer noopener" className={linkClass}>
            {part.href}
          </a>
        );
      })}
    </>
  );
}
