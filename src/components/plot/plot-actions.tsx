// The export buttons beside every chart: PNG, SVG and the points drawn as CSV. A chart whose
// drawn values are not its data (a waterfall's floating bars) passes its own CSV text instead.
import type { RefObject } from 'react';
import { Button } from '@/components/ui/button';
import { downloadText, exportPlot, exportPlotCsv, type ExportLayout } from './export';

/** `exportLayout`: what the exported image adds to the chart on screen (a title block, the legend written out). */
export function PlotActions({ target, fileName, csv, label = 'plot', exportLayout }: { target: RefObject<HTMLElement | null>; fileName: string; csv?: () => string; label?: string; exportLayout?: () => ExportLayout }) {
  return (
    <span className="print-hidden flex gap-1.5" role="group" aria-label={`Export the ${label}`}>
      <Button onClick={() => exportPlot(target.current, 'png', fileName, exportLayout?.())} aria-label={`Export the ${label} as PNG`}>PNG</Button>
      <Button onClick={() => exportPlot(target.current, 'svg', fileName, exportLayout?.())} aria-label={`Export the ${label} as SVG`}>SVG</Button>
      <Button onClick={() => (csv ? downloadText(csv(), `${fileName}.csv`) : exportPlotCsv(target.current, fileName))} aria-label={`Export the ${label}'s data as CSV`}>CSV</Button>
    </span>
  );
}
