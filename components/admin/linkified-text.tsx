import { Fragment } from "react";

// Own tiny splitter instead of a linkify package: only http(s) URLs in our own mail bodies need it.
const URL_RE = /(https?:\/\/[^\s<>"]+)/g;

/** Renders plain text with http(s) URLs as clickable links, preserving line breaks. */
export function LinkifiedText({ text }: { text: string }) {
  const parts = text.split(URL_RE);
  return (
    <p className="whitespace-pre-wrap break-words font-mono text-sm text-ink-800">
      {parts.map((part, i) =>
        i % 2 === 1 ? (
          <a key={i} href={part} className="break-all">
            {part}
          </a>
        ) : (
          <Fragment key={i}>{part}</Fragment>
        ),
      )}
    </p>
  );
}
