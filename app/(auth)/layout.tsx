import type { ReactNode } from 'react';
import { Logo } from '@/components/app-shell/logo';

/** Sign-in and sign-up: the product statement on the left, the form on the right. */
export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <div className="grid min-h-screen grid-cols-[minmax(22rem,5fr)_7fr]">
      <aside className="relative flex flex-col justify-between overflow-hidden bg-grey-900 px-10 py-10 text-grey-100">
        <div className="flex items-center gap-2">
          <Logo className="[&>span:last-child]:text-white" />
        </div>
        <FieldSketch />
        <div className="relative max-w-md">
          <p className="text-xl font-semibold leading-snug text-white">
            Capacitance, fringing and line impedance of the cross-sections you draw — each with its error.
          </p>
          <p className="mt-3 text-sm text-grey-300">
            For hardware engineers working on traces, cables, sensor electrodes and insulation. Solved on your own machine,
            shared with your team.
          </p>
        </div>
      </aside>
      <main id="main" className="flex items-center justify-center px-8 py-12">
        <div className="w-full max-w-form">{children}</div>
      </main>
    </div>
  );
}

/** A quiet drawing: a trace over a ground plane with equipotentials bending round its edges. */
function FieldSketch() {
  const levels = [0.18, 0.34, 0.5, 0.66, 0.82];
  return (
    <svg
      viewBox="0 0 400 260"
      aria-hidden
      className="pointer-events-none absolute inset-x-0 top-1/2 w-full -translate-y-1/2 opacity-90"
      preserveAspectRatio="xMidYMid meet"
    >
      {levels.map((t, i) => {
        const y = 210 - t * 120;
        const bulge = 40 + t * 70;
        return (
          <path
            key={i}
            d={`M0 ${210 - t * 30} C 80 ${210 - t * 34}, ${150 - bulge} ${y - 10}, 150 ${y - 14} L 250 ${y - 14} C ${250 + bulge} ${y - 10}, 320 ${210 - t * 34}, 400 ${210 - t * 30}`}
            fill="none"
            stroke="#3f7398"
            strokeOpacity={0.25 + 0.12 * i}
            strokeWidth="1.2"
          />
        );
      })}
      {[-3, -2, -1, 0, 1, 2, 3].map((k) => {
        const x = 200 + k * 17;
        return <line key={k} x1={x} y1={124} x2={x} y2={210} stroke="#8fb3cb" strokeOpacity="0.35" strokeWidth="1" />;
      })}
      {[1, 2, 3].map((k) => (
        <g key={k} fill="none" stroke="#8fb3cb" strokeOpacity={0.42 - k * 0.08} strokeWidth="1">
          <path d={`M252 ${118 + k} C ${262 + k * 22} ${118 - k * 16}, ${280 + k * 34} ${160}, ${284 + k * 34} 210`} />
          <path d={`M148 ${118 + k} C ${138 - k * 22} ${118 - k * 16}, ${120 - k * 34} ${160}, ${116 - k * 34} 210`} />
        </g>
      ))}
      <rect x="145" y="112" width="110" height="12" rx="2" fill="#d5773b" />
      <rect x="0" y="210" width="400" height="6" fill="#4e5b61" />
    </svg>
  );
}
