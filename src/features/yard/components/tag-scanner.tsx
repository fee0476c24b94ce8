import { BarcodeDetector, prepareZXingModule } from 'barcode-detector/ponyfill';
import { Icon } from '../../../components/ui/icon';
import wasmUrl from 'zxing-wasm/reader/zxing_reader.wasm?url';
import { useEffect, useRef, useState } from 'react';

// The QR reader's .wasm is served by the app itself (and precached for offline use), never from a CDN.
prepareZXingModule({ overrides: { locateFile: (path: string, prefix: string) => (path.endsWith('.wasm') ? wasmUrl : prefix + path) } });

const PIECE_IN_TAG = /pieces\/([0-9a-f-]{36})/i;

/** Reads a piece tag with the tablet camera and hands over the piece id it names. */
export default function TagScanner({ onPiece, onClose }: { onPiece: (id: string) => void; onClose: () => void }) {
  const video = useRef<HTMLVideoElement>(null);
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => {
    let stream: MediaStream | null = null;
    let stopped = false;
    const detector = new BarcodeDetector({ formats: ['qr_code'] });
    const tick = async (): Promise<void> => {
      if (stopped || !video.current) return;
      try {
        const codes = await detector.detect(video.current);
        const id = codes.map((c) => PIECE_IN_TAG.exec(c.rawValue)?.[1]).find(Boolean);
        if (id) {
          onPiece(id);
          return;
        }
      } catch {
        // a frame that cannot be read yet; try the next one
      }
      setTimeout(() => void tick(), 200);
    };
    (async () => {
      if (!navigator.mediaDevices?.getUserMedia) throw new Error('no camera API');
      stream = await navigator.mediaDevices.getUserMedia({ video: { facingMode: 'environment' } });
      if (stopped || !video.current) return;
      video.current.srcObject = stream;
      await video.current.play();
      void tick();
    })().catch(() => setProblem('The camera is not available on this device or was not allowed. Type the mark instead.'));
    return () => {
      stopped = true;
      stream?.getTracks().forEach((t) => t.stop());
    };
  }, [onPiece]);
  return (
    <div className="rounded-lg border-2 border-ink bg-white p-3">
      {problem ? (
        <p role="alert" className="text-yard font-semibold">
          <Icon name="warning" /> {problem}
        </p>
      ) : (
        <video ref={video} className="w-full rounded" muted playsInline aria-label="Camera view for reading a piece tag" />
      )}
      <button type="button" className="btn-quiet mt-3 min-h-[56px] w-full text-yard" onClick={onClose}>
        Close the scanner
      </button>
    </div>
  );
}
