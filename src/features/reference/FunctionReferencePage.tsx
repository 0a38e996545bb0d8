import { useDeferredValue, useMemo, useState } from 'react';
import { SearchIcon } from '../../components/ui/icons.js';
import { Notice } from '../../components/ui/Notice.js';
import { cautionText, cautionTitle } from '@shared/cautions.js';
import { FunctionEntry } from './FunctionEntry.js';
import { allFunctions, groupByFamily, searchFunctions } from './referenceData.js';

/** Every cell function, grouped by family, searchable; the same text the in-cell help shows. */
export function FunctionReferencePage() {
  const [query, setQuery] = useState('');
  const deferredQuery = useDeferredValue(query);
  const groups = useMemo(() => groupByFamily(searchFunctions(allFunctions, deferredQuery)), [deferredQuery]);
  const shown = groups.reduce((n, g) => n + g.functions.length, 0);

  return (
    <div className="mx-auto flex w-full max-w-6xl gap-6 px-6 py-5">
      <title>Functions · Orbitab</title>
      <nav aria-label="Functions by family" className="sticky top-5 hidden max-h-[calc(100vh-6rem)] w-48 shrink-0 self-start overflow-y-auto lg:block">
        {groups.map((g) => (
          <div key={g.family} className="mb-3">
            <p className="mb-1 text-caption font-semibold tracking-wide text-ink-3 uppercase">{g.family}</p>
            <ul>
              {g.functions.map((f) => (
                <li key={f.name}>
                  <a href={`#fn-${f.name}`} className="block truncate rounded-ctl px-1.5 py-0.5 font-mono text-[12px] text-ink-2 hover:bg-hover hover:text-ink">
                    {f.name}
                  </a>
                </li>
              ))}
            </ul>
          </div>
        ))}
      </nav>

      <div className="min-w-0 flex-1">
        <h1 className="text-heading font-semibold tracking-tight">Functions</h1>
        <p className="mt-0.5 mb-3 text-ink-3">Chemistry functions for cells, with their parameters, units, worked examples and the published method behind each.</p>

        <Notice tone="caution" title={cautionTitle} className="mb-4">
          {cautionText}
        </Notice>

        <div className="mb-3 flex items-center gap-3">
          <label className="flex h-8 w-80 items-center gap-2 rounded-ctl border border-line-strong bg-surface px-2 text-ink-3 focus-within:outline-2 focus-within:outline-focus">
            <SearchIcon />
            <input
              type="search"
              aria-label="Search functions"
              value={query}
              onChange={(e) => setQuery(e.target.value)}
              placeholder="Search name, parameter or topic"
              className="h-full min-w-0 flex-1 bg-transparent text-ui text-ink outline-none placeholder:text-ink-3"
            />
          </label>
          <p role="status" className="text-caption text-ink-3">
            {allFunctions.length === 0
              ? 'No functions are in the catalog yet.'
              : deferredQuery.trim()
                ? `${shown} of ${allFunctions.length} functions match “${deferredQuery.trim()}”.`
                : `${allFunctions.length} functions in ${groups.length} ${groups.length === 1 ? 'family' : 'families'}.`}
          </p>
        </div>

        {groups.map((g) => (
          <section key={g.family} aria-labelledby={`family-${g.family}`} className="mb-6">
            <h2 id={`family-${g.family}`} className="mb-2 border-b border-line pb-1 text-title font-semibold">
              {g.family}
            </h2>
            <div className="flex flex-col gap-3">
              {g.functions.map((f) => (
                <FunctionEntry key={f.name} fn={f} />
              ))}
            </div>
          </section>
        ))}
      </div>
    </div>
  );
}
