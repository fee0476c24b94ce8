import QRCode from 'qrcode';
import { useEffect, useState } from 'react';

/** A printable tag: the QR code opens the piece's yard page; mark and job are printed beside it. */
export function PieceTag({ pieceId, mark, jobNumber, origin }: { pieceId: string; mark: string; jobNumber: string; origin: string }) {
  const [svg, setSvg] = useState('');
  useEffect(() => {
    void QRCode.toString(`${origin}/yard/pieces/${pieceId}`, { type: 'svg', margin: 1, errorCorrectionLevel: 'M' }).then(setSvg);
  }, [origin, pieceId]);
  return (
    <figure className="flex items-center gap-4 border border-ink p-3" style={{ breakInside: 'avoid' }}>
      <div className="h-32 w-32 shrink-0" role="img" aria-label={`QR code for piece ${mark}`} dangerouslySetInnerHTML={{ __html: svg }} />
      <figcaption>
        <p className="text-3xl font-semibold">{mark}</p>
        <p className="text-lg">Job {jobNumber}</p>
      </figcaption>
    </figure>
  );
}
