// A few line icons drawn for Orbitab (16px grid, 1.5 stroke, currentColor).
import type { SVGProps } from 'react';
import { orbitabMarkShapes } from './markShapes.js';

function Icon(props: SVGProps<SVGSVGElement>) {
  return <svg viewBox="0 0 16 16" width="16" height="16" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" {...props} />;
}

export const SunIcon = () => (
  <Icon>
    <circle cx="8" cy="8" r="3" />
    <path d="M8 1.5v1.5M8 13v1.5M1.5 8H3M13 8h1.5M3.4 3.4l1 1M11.6 11.6l1 1M3.4 12.6l1-1M11.6 4.4l1-1" />
  </Icon>
);

export const MoonIcon = () => (
  <Icon>
    <path d="M13.2 9.6A5.5 5.5 0 0 1 6.4 2.8a5.5 5.5 0 1 0 6.8 6.8Z" />
  </Icon>
);

export const PlusIcon = () => (
  <Icon>
    <path d="M8 3v10M3 8h10" />
  </Icon>
);

export const SearchIcon = () => (
  <Icon>
    <circle cx="7" cy="7" r="4.25" />
    <path d="m10.2 10.2 3.3 3.3" />
  </Icon>
);

export const ChevronDownIcon = () => (
  <Icon>
    <path d="m4.5 6.5 3.5 3.5 3.5-3.5" />
  </Icon>
);

export const SheetIcon = () => (
  <Icon>
    <rect x="2.5" y="2.5" width="11" height="11" rx="1.5" />
    <path d="M2.5 6.2h11M6.3 2.5v11" />
  </Icon>
);

/** The Orbitab mark: a nucleus with one tilted orbit. */
export const OrbitabMark = ({ size = 18 }: { size?: number }) => (
  <svg viewBox="0 0 16 16" width={size} height={size} aria-hidden="true">
    {orbitabMarkShapes.map(({ tag: Shape, attrs }) => (
      <Shape key={Shape} {...attrs} />
    ))}
  </svg>
);

/** A closed padlock, for locked sheets. */
export const LockIcon = (props: { className?: string }) => (
  <Icon width="12" height="12" className={props.className}>
    <rect x="3.5" y="7" width="9" height="6.5" rx="1.25" />
    <path d="M5.5 7V5a2.5 2.5 0 0 1 5 0v2" />
  </Icon>
);
