import type { FunctionHelp } from './referenceData.js';

const typeNames = { number: 'number', integer: 'whole number', string: 'text', boolean: 'TRUE/FALSE', range: 'range', any: 'any' } as const;

/** One function of the reference: signature, what it computes, its parameters, examples and source. */
export function FunctionEntry({ fn }: { fn: FunctionHelp }) {
  return (
    <article id={`fn-${fn.name}`} aria-labelledby={`fn-${fn.name}-name`} className="scroll-mt-3 rounded-panel border border-line bg-surface">
      <header className="border-b border-line px-4 py-2.5">
        <h3 id={`fn-${fn.name}-name`} className="font-mono text-ui font-medium text-accent">
          {fn.name}
        </h3>
        <p className="mt-1 text-ui text-ink">{fn.summary}</p>
      </header>
      <div className="flex flex-col gap-3 px-4 py-3">
        <code className="block overflow-x-auto rounded-ctl border border-line bg-raised px-2 py-1.5 text-ink">{fn.signature}</code>

        {fn.params.length > 0 && (
          <section aria-label="Parameters">
            <h4 className="mb-1 text-caption font-semibold tracking-wide text-ink-3 uppercase">Parameters</h4>
            <table className="w-full border-collapse text-left text-ui">
              <tbody>
                {fn.params.map((p) => (
                  <tr key={p.name} className="border-t border-line align-top first:border-t-0">
                    <td className="w-36 py-1 pr-3 font-mono text-[12px] text-ink">
                      {p.name}
                      {p.optional && <span className="ml-1 font-sans text-caption text-ink-3">optional</span>}
                    </td>
                    <td className="w-28 py-1 pr-3 text-ink-3">{typeNames[p.type]}</td>
                    <td className="py-1 text-ink-2">
                      {p.description}
                      {p.unit && <span className="text-ink-3"> Unit: {p.unit}.</span>}
                      {p.default !== undefined && (
                        <span className="text-ink-3">
                          {' '}
                          Default: <code>{String(p.default)}</code>.
                        </span>
                      )}
                      {p.choices && (
                        <span className="text-ink-3">
                          {' '}
                          One of{' '}
                          {p.choices.map((c, i) => (
                            <span key={c}>
                              {i > 0 && ', '}
                              <code>{c}</code>
                            </span>
                          ))}
                          .
                        </span>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </section>
        )}

        <section aria-label="Returns">
          <h4 className="mb-1 text-caption font-semibold tracking-wide text-ink-3 uppercase">Returns</h4>
          <p className="text-ink-2">
            {fn.returns.description}
            {fn.returns.unit && <span className="text-ink-3"> Unit: {fn.returns.unit}.</span>}
            {fn.spills && <span className="text-ink-3"> Can spill a table into the neighbouring cells: leave out its last arguments to get the whole table.</span>}
          </p>
        </section>

        {fn.examples.length > 0 && (
          <section aria-label="Examples">
            <h4 className="mb-1 text-caption font-semibold tracking-wide text-ink-3 uppercase">Examples</h4>
            <ul className="flex flex-col gap-1">
              {fn.examples.map((e) => (
                <li key={e.formula} className="flex flex-wrap items-baseline gap-x-2">
                  <code className="text-ink">{e.formula}</code>
                  <span aria-hidden="true" className="text-ink-3">
                    →
                  </span>
                  <span className="sr-only">gives</span>
                  <code className="font-medium text-ink">
                    {e.approximate && <span title="rounded">≈ </span>}
                    {e.expectedText}
                  </code>
                  {e.note && <span className="text-caption text-ink-3">{e.note}</span>}
                </li>
              ))}
            </ul>
          </section>
        )}

        <section aria-label="Source">
          <h4 className="mb-1 text-caption font-semibold tracking-wide text-ink-3 uppercase">Method and source</h4>
          <p className="text-caption text-ink-2">{fn.source}</p>
        </section>
        {fn.seeAlso.length > 0 && (
          <p className="text-caption text-ink-2">
            See also:{' '}
            {fn.seeAlso.map((name, i) => (
              <span key={name}>
                {i > 0 && ', '}
                <a href={`#fn-${name}`} className="font-mono text-accent hover:underline">
                  {name}
                </a>
              </span>
            ))}
          </p>
        )}
      </div>
    </article>
  );
}
