// Small line icons drawn for Midgray (24-unit grid, stroke in the current colour). Decorative:
// every use sits beside words that say the same, so they are hidden from screen readers.
import type { SVGProps } from 'react';

const base = (props: SVGProps<SVGSVGElement>) => ({
  viewBox: '0 0 24 24',
  fill: 'none',
  stroke: 'currentColor',
  strokeWidth: 2,
  strokeLinecap: 'round' as const,
  strokeLinejoin: 'round' as const,
  'aria-hidden': true,
  focusable: false,
  width: 16,
  height: 16,
  ...props,
});

/** A triangle with an exclamation mark: a date needs attention. */
export const WarningIcon = (p: SVGProps<SVGSVGElement>) => (
  <svg {...base(p)}>
    <path d="M12 3.5 2.5 20h19z" />
    <path d="M12 10v4.5M12 17.5v.01" />
  </svg>
);

/** A clock face: an upcoming date. */
export const ClockIcon = (p: SVGProps<SVGSVGElement>) => (
  <svg {...base(p)}>
    <circle cx="12" cy="12" r="8.5" />
    <path d="M12 7.5V12l3 2" />
  </svg>
);

/** A strip of film: footage files. */
export const FootageIcon = (p: SVGProps<SVGSVGElement>) => (
  <svg {...base(p)}>
    <rect x="4" y="3.5" width="16" height="17" rx="1.5" />
    <path d="M8 3.5v17M16 3.5v17M4 8.5h4M4 15.5h4M16 8.5h4M16 15.5h4" />
  </svg>
);

/** A checklist: spec-sheet lines. */
export const ChecklistIcon = (p: SVGProps<SVGSVGElement>) => (
  <svg {...base(p)}>
    <path d="M10 6.5h10M10 12h10M10 17.5h10" />
    <path d="m3.5 6.5 1.5 1.5 2.5-3M3.5 12h3.5M3.5 17.5h3.5" />
  </svg>
);

/** Six dots: a handle to drag by. */
export const GripIcon = (p: SVGProps<SVGSVGElement>) => (
  <svg {...base({ strokeWidth: 3, ...p })}>
    <path d="M9 6v.01M15 6v.01M9 12v.01M15 12v.01M9 18v.01M15 18v.01" />
  </svg>
);
