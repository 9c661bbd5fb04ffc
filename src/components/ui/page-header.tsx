import type { ReactNode } from 'react';

export function PageHeader({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-3">
      <h1 className="text-2xl font-bold text-tide-900">{title}</h1>
      {children && <div className="flex gap-2">{children}</div>}
    </div>
  );
}
