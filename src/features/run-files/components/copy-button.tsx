import { useState } from 'react';
import { toast } from 'sonner';

/** Copies text; falls back to a hidden textarea where the Clipboard API is not offered (plain http). */
export async function copyText(text: string): Promise<boolean> {
  try {
    if (navigator.clipboard && window.isSecureContext) {
      await navigator.clipboard.writeText(text);
      return true;
    }
  } catch {
    /* fall back below */
  }
  const ta = document.createElement('textarea');
  ta.value = text;
  ta.setAttribute('readonly', '');
  ta.style.position = 'fixed';
  ta.style.opacity = '0';
  document.body.appendChild(ta);
  ta.select();
  let ok = false;
  try {
    ok = document.execCommand('copy');
  } catch {
    ok = false;
  }
  ta.remove();
  return ok;
}

export function CopyButton({ text, label, className = '' }: { text: string; label: string; className?: string }) {
  const [copied, setCopied] = useState(false);
  return (
    <button
      type="button"
      aria-label={label}
      title={label}
      className={`no-print inline-flex shrink-0 items-center rounded border border-ink-300 bg-white px-1.5 py-0.5 text-2xs font-medium text-ink-700 hover:bg-ink-100 ${className}`}
      onClick={async () => {
        if (await copyText(text)) {
          setCopied(true);
          window.setTimeout(() => setCopied(false), 1500);
        } else toast.error('Could not copy. Select the text and copy it by hand.');
      }}
    >
      {copied ? 'Copied' : 'Copy'}
    </button>
  );
}

/** A SHA-256 in full, in the mono font, with a copy button. */
export function Sha256({ value, what }: { value: string; what: string }) {
  return (
    <span className="flex items-start gap-2">
      <code className="num break-all text-xs leading-5 text-ink-800" data-sha256={value}>
        {value}
      </code>
      <CopyButton text={value} label={`Copy the SHA-256 of ${what}`} />
    </span>
  );
}
