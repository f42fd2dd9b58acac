/**
 * An e-mail address that may wrap only before its "@" and its dots, never inside a word
 * ("ines.achterberg@skerrow.example" breaks as "ines.achterberg" / "@skerrow" / ".example").
 * `break-words` stays as a last resort for a single part wider than its column.
 */
import { Fragment } from 'react';

export function EmailText({ email, className = '' }: { email: string; className?: string }) {
  const parts = email.split(/(?=[@.])/);
  return (
    <span className={`break-words ${className}`} data-wrap-parts="">
      {parts.map((part, i) => (
        <Fragment key={i}>
          {i > 0 && <wbr />}
          {part}
        </Fragment>
      ))}
    </span>
  );
}
