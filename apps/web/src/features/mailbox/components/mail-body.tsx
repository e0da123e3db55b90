import { linkify } from '../../../lib/linkify';
import { textLinkClasses } from '../../../components/ui/text-link';

/** A mail's plain-text body with its URLs as links. The HTML part is never rendered. */
export function MailBody({ text }: { text: string }) {
  return (
    <div className="font-sans text-sm leading-relaxed break-words whitespace-pre-wrap text-ink-800">
      {linkify(text).map((part, index) =>
        part.kind === 'link' ? (
          <a key={index} href={part.href} className={textLinkClasses}>
            {part.text}
          </a>
        ) : (
          <span key={index}>{part.text}</span>
        ),
      )}
    </div>
  );
}
