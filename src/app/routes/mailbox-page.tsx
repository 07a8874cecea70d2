import { Link } from 'react-router-dom';
import type { MailboxMessageView } from '../../../shared/api/responses';
import { EmptyState } from '../../components/empty-state';
import { LoadingBlock } from '../../components/loading-block';
import { Notice } from '../../components/notice';
import { ThemeToggle } from '../../components/theme-toggle';
import { isMailboxOff, MAILBOX_REFRESH_MS, useMailbox } from '../../features/mailbox/api/get-mailbox';
import { LinkedText } from '../../features/mailbox/components/linked-text';
import { formatDateTime } from '../../features/members/format-time';

/** `/dev/mailbox`: the mail a local server sent (no SMTP_URL), newest first, refreshed every few seconds. */
export default function MailboxPage() {
  const mailbox = useMailbox();
  const off = isMailboxOff(mailbox.error);

  return (
    <div className="min-h-screen">
      <header className="border-b border-slate-700/15 dark:border-slate-300/10">
        <div className="mx-auto flex max-w-3xl items-center gap-3 px-6 py-3">
          <Link to="/" className="text-lg font-semibold tracking-tight focus-visible:outline-2 focus-visible:outline-teal-400">
            <span className="text-brass-600 dark:text-brass-400">Taut</span>line
          </Link>
          <span className="text-sm text-slate-700 dark:text-slate-300">Local mailbox</span>
          <div className="ml-auto">
            <ThemeToggle />
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-3xl px-6 py-8">
        <h1 className="text-2xl font-semibold">Local mailbox</h1>
        <p className="mt-1 mb-6 text-sm text-slate-700 dark:text-slate-300">
          With no SMTP server set up, Tautline keeps the mail it sends here instead: invitations and password resets. This page looks for new mail every{' '}
          {MAILBOX_REFRESH_MS / 1000} seconds.
        </p>
        {off ? (
          <Notice title="The local mailbox is off: this server sends real e-mail.">Look for the messages in the recipients' own mailboxes.</Notice>
        ) : mailbox.isPending ? (
          <LoadingBlock label="Opening the mailbox…" rows={3} />
        ) : mailbox.isError && !mailbox.data ? (
          <Notice tone="error" title="Cannot read the local mailbox">
            {mailbox.error.message} Trying again every {MAILBOX_REFRESH_MS / 1000} seconds.
          </Notice>
        ) : (
          <>
            {mailbox.isError && (
              <div className="mb-4">
                <Notice tone="caution" title="Cannot refresh the mailbox">
                  {mailbox.error.message} Showing the mail read last.
                </Notice>
              </div>
            )}
            {mailbox.data.length === 0 ? (
              <EmptyState title="No mail yet">Invite someone or ask for a password reset: the message shows up here within a few seconds.</EmptyState>
            ) : (
              <ol aria-label="Messages, newest first" className="flex flex-col gap-4">
                {mailbox.data.map((message) => (
                  <li key={message.id}>
                    <MessageCard message={message} />
                  </li>
                ))}
              </ol>
            )}
          </>
        )}
      </main>
    </div>
  );
}

function MessageCard({ message }: { message: MailboxMessageView }) {
  const headingId = `message-${message.id}`;
  return (
    <article aria-labelledby={headingId} className="rounded-lg border border-slate-700/15 bg-white p-4 dark:border-slate-300/10 dark:bg-slate-900">
      <h2 id={headingId} className="font-semibold">
        {message.subject || '(no subject)'}
      </h2>
      <dl className="mt-1 flex flex-wrap gap-x-4 text-sm text-slate-700 dark:text-slate-300">
        <div className="flex gap-1">
          <dt>To</dt>
          <dd className="break-all">{message.to.join(', ')}</dd>
        </div>
        <div className="flex gap-1">
          <dt>Received</dt>
          <dd>
            <time dateTime={message.receivedAt}>{formatDateTime(message.receivedAt)}</time>
          </dd>
        </div>
      </dl>
      <div className="mt-3 whitespace-pre-wrap break-words text-sm">
        <LinkedText text={message.text} />
      </div>
    </article>
  );
}
