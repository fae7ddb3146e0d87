/** Stand-in for next/link in the static bench harness. */
import type { AnchorHTMLAttributes } from 'react';

export default function Link({ href, ...rest }: AnchorHTMLAttributes<HTMLAnchorElement> & { href: string }) {
  return <a href={href} {...rest} />;
}
