/**
 * Administration › Mailbox (development): the mail Phasebook sent, as caught by the local fake
 * mailbox, so a developer can follow reset links and notices without a real mail server.
 */
import { Fragment, useState } from "react";
import { isApiError } from "@/lib/api-client";
import { describeError } from "@/lib/forms";
import { formatDateTime } from "@/lib/format";
import { cn } from "@/lib/cn";
import { useMailbox, type MailboxMessage } from "../api/get-mailbox";
import { Alert } from "@/components/ui/alert";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingLine } from "@/components/ui/spinner";
import { Button } from "@/components/ui/button";

const URL_PATTERN = /(https?:\/\/[^\s<>"')\]]+)/g;

/** Plain text with its web addresses made clickable, so reset links can be followed from here. */
function LinkifiedText({ text }: { text: string }) {
  const parts = text.split(URL_PATTERN);
  return (
    <pre className="whitespace-pre-wrap break-words font-mono text-xs leading-5 text-grey-800">
      {parts.map((part, i) =>
        i % 2 === 1 ? (
          <a key={i} href={part} className="break-all">
            {part}
          </a>
        ) : (
          <Fragment key={i}>{part}</Fragment>
        ),
      )}
    </pre>
  );
}

function Reader({ message }: { message: MailboxMessage }) {
  const [showHtml, setShowHtml] = useState(false);
  return (
    <article className="flex min-h-0 flex-col gap-3" aria-labelledby="mail-subject">
      <header className="border-b border-grey-200 pb-2">
        <h2 id="mail-subject" className="text-base font-semibold text-grey-900">
          {message.subject || "(no subject)"}
        </h2>
        <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3 text-xs text-grey-600">
          <dt>From</dt>
          <dd className="text-grey-800">{message.from ?? "(none)"}</dd>
          <dt>To</dt>
          <dd className="text-grey-800">{message.to.join(", ") || "(none)"}</dd>
          <dt>Date</dt>
          <dd className="text-grey-800">{formatDateTime(message.date)}</dd>
        </dl>
        {message.html && (
          <div className="mt-2 flex gap-1" role="group" aria-label="Show the message as">
            <Button size="sm" variant={showHtml ? "ghost" : "secondary"} aria-pressed={!showHtml} onClick={() => setShowHtml(false)}>
              Text
            </Button>
            <Button size="sm" variant={showHtml ? "secondary" : "ghost"} aria-pressed={showHtml} onClick={() => setShowHtml(true)}>
              HTML
            </Button>
          </div>
        )}
      </header>
      {showHtml && message.html ? (
        // An empty sandbox runs no scripts and cannot reach this page, whatever the mail contains.
        <iframe title="HTML version of the message" sandbox="" srcDoc={message.html} className="h-[28rem] w-full rounded border border-grey-200 bg-white" />
      ) : (
        <LinkifiedText text={message.text || "(this message has no text part)"} />
      )}
    </article>
  );
}

export function MailboxView() {
  const mailbox = useMailbox();
  const [selectedId, setSelectedId] = useState<string | null>(null);

  if (mailbox.isPending) return <LoadingLine label="Loading the mailbox" />;
  if (mailbox.isError) {
    if (isApiError(mailbox.error, 404)) {
      return (
        <Alert tone="info">
          The local mailbox is switched off here: it exists only in development. In production Phasebook sends mail through the
          configured mail server.
        </Alert>
      );
    }
    return <Alert tone="danger">{describeError(mailbox.error)}</Alert>;
  }

  const items = mailbox.data.items;
  const notice = (
    <Alert tone="warning" className="mb-4">
      This is the local fake mailbox used in development: the messages below went to no real inbox.
    </Alert>
  );
  if (items.length === 0) {
    return (
      <>
        {notice}
        <EmptyState title="No mail yet">
          Messages appear here a few seconds after Phasebook sends them, for example when someone asks for a password reset link.
        </EmptyState>
      </>
    );
  }
  const selected = items.find((m) => m.id === selectedId) ?? null;

  return (
    <>
      {notice}
      <div className="grid gap-4 lg:grid-cols-[minmax(16rem,22rem)_1fr]">
        <ul className="flex max-h-[70vh] flex-col self-start divide-y divide-grey-100 overflow-y-auto rounded-lg border border-grey-200 bg-white" aria-label="Received mail, newest first">
          {items.map((m) => (
            <li key={m.id}>
              <button
                type="button"
                onClick={() => setSelectedId(m.id)}
                aria-current={m.id === selectedId ? "true" : undefined}
                className={cn(
                  "flex w-full flex-col gap-0.5 px-3 py-2 text-left hover:bg-grey-50",
                  m.id === selectedId && "bg-aqueous-50 hover:bg-aqueous-50",
                )}
              >
                <span className="flex items-baseline justify-between gap-2">
                  <span className="truncate font-medium text-grey-900">{m.subject || "(no subject)"}</span>
                  <span className="shrink-0 text-xs text-grey-500">{formatDateTime(m.date)}</span>
                </span>
                <span className="truncate text-xs text-grey-600">to {m.to.join(", ")}</span>
              </button>
            </li>
          ))}
        </ul>
        <div className="min-w-0 rounded-lg border border-grey-200 bg-white p-4">
          {selected ? <Reader key={selected.id} message={selected} /> : <p className="text-grey-600">Choose a message to read it.</p>}
        </div>
      </div>
    </>
  );
}
