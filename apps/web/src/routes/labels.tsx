import { useSearchParams } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { Download, Printer } from 'lucide-react';
import type { LabelDto } from '@barmkeep/schemas';
import { labelPngUrl, labelQueries } from '../api/labels/queries';
import { Button, Loading, Notice, PageHeader, cx } from '../components';

type Layout = 'sheet' | 'single';

/**
 * Print page for jar labels. "sheet": 63.5 × 38.1 mm labels, 3 across and 7 down on A4 (a common
 * 21-label sheet). "single": one 50 × 25 mm label per page, for a label printer roll.
 */
const PRINT_CSS = `
@media print {
  @page { margin: 0; }
  body { background: #fff !important; }
  header, .no-print { display: none !important; }
  main { padding: 0 !important; margin: 0 !important; max-width: none !important; }
  .label-sheet { width: 210mm; padding: 15.15mm 7.25mm 0; display: grid; grid-template-columns: repeat(3, 63.5mm);
    grid-auto-rows: 38.1mm; column-gap: 2.5mm; row-gap: 0; }
  .label-sheet .jar-label { border: none !important; }
  .label-single .jar-label { page-break-after: always; break-after: page; border: none !important; margin: 0 !important; }
}
@page single { size: 50mm 25mm; }
.label-single { page: single; }
`;

function JarLabel({ label, layout }: { label: LabelDto; layout: Layout }) {
  const size = layout === 'sheet' ? { w: '63.5mm', h: '38.1mm' } : { w: '50mm', h: '25mm' };
  return (
    <figure
      className="jar-label flex items-center gap-[2mm] overflow-hidden rounded-sm border border-dashed border-rule-strong bg-white p-[2mm] text-black"
      style={{ width: size.w, height: size.h }}
      data-testid="jar-label"
    >
      <div
        className="aspect-square h-full shrink-0 [&>svg]:h-full [&>svg]:w-full"
        role="img"
        aria-label={`QR code opening ${label.url}`}
        dangerouslySetInnerHTML={{ __html: label.qrSvg }}
      />
      <figcaption className={cx('min-w-0 leading-tight', layout === 'sheet' ? 'text-[9pt]' : 'text-[6.5pt]')}>
        <p className="num font-bold" style={{ fontSize: layout === 'sheet' ? '13pt' : '9pt' }}>
          {label.code}
        </p>
        <p className="truncate font-semibold">{label.strainName}</p>
        <p>
          Gen <span className="num">{label.generation}</span> · {label.form}
        </p>
        <p className="num">{label.date}</p>
        <p className="truncate">{label.storage}</p>
      </figcaption>
    </figure>
  );
}

export function Component() {
  const [params, setParams] = useSearchParams();
  const ids = (params.get('ids') ?? '').split(',').filter(Boolean);
  const layout: Layout = params.get('layout') === 'single' ? 'single' : 'sheet';
  const labels = useQuery(labelQueries.list(ids));
  const setLayout = (l: Layout) =>
    setParams((p) => {
      p.set('layout', l);
      return p;
    });
  return (
    <>
      <title>Jar labels · Barmkeep</title>
      <style>{PRINT_CSS}</style>
      <div className="no-print">
        <PageHeader
          title="Jar labels"
          description="Print on a sheet of 21 labels (63.5 × 38.1 mm, A4) or one small 50 × 25 mm label at a time. Scanning the code opens a quick log for the culture."
          actions={
            <Button
              icon={<Printer aria-hidden className="size-4" />}
              onClick={() => window.print()}
              disabled={!labels.data}
            >
              Print
            </Button>
          }
        />
        <fieldset className="mb-4 flex flex-wrap gap-2">
          <legend className="sr-only">Layout</legend>
          {(['sheet', 'single'] as const).map((l) => (
            <Button
              key={l}
              variant={layout === l ? 'primary' : 'secondary'}
              aria-pressed={layout === l}
              onClick={() => setLayout(l)}
            >
              {l === 'sheet' ? 'Label sheet (21 on A4)' : 'Single small label'}
            </Button>
          ))}
        </fieldset>
        <p className="mb-4 text-sm text-ink-muted">
          Use a label that stands up to the fridge or freezer; take labels off before boiling or sanitising glass.
        </p>
      </div>
      {ids.length === 0 ? (
        <Notice title="No culture chosen">Open a culture and choose “Print label”, or add ?ids= to the address.</Notice>
      ) : labels.isError ? (
        <Notice tone="danger" title="Could not make the labels">
          {labels.error.message}
        </Notice>
      ) : !labels.data ? (
        <Loading />
      ) : (
        <>
          <div
            className={cx(layout === 'sheet' ? 'label-sheet flex flex-wrap gap-2' : 'label-single flex flex-col gap-2')}
          >
            {labels.data.map((l) => (
              <JarLabel key={l.cultureId} label={l} layout={layout} />
            ))}
          </div>
          <ul className="no-print mt-6 flex flex-wrap gap-2">
            {labels.data.map((l) => (
              <li key={l.cultureId}>
                <a
                  className="inline-flex min-h-11 items-center gap-2 rounded-md border border-rule-strong px-3 text-sm hover:bg-paper-sunk"
                  href={labelPngUrl(l.cultureId, layout === 'sheet' ? 'large' : 'small')}
                  download
                >
                  <Download aria-hidden className="size-4" /> PNG of {l.code}
                </a>
              </li>
            ))}
          </ul>
        </>
      )}
    </>
  );
}
