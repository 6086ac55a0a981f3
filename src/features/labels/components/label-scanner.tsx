import { useCallback, useEffect, useRef, useState, type FormEvent } from 'react';
import { parseScannedCode, type ScannedCode } from '@shared/domain/label-codes';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';

/** What the page does with a code: nothing to say (it moved on), or a sentence for the person. */
export type CodeHandler = (code: ScannedCode) => Promise<string | undefined> | string | undefined;

function cameraProblem(err: unknown): string {
  const name = err instanceof DOMException ? err.name : '';
  if (name === 'NotAllowedError' || name === 'SecurityError')
    return 'The camera is blocked for this site. Allow it in the browser’s site settings, or type the tag below.';
  if (name === 'NotFoundError' || name === 'OverconstrainedError') return 'No camera was found on this device. Type the tag below.';
  if (name === 'NotReadableError') return 'The camera is in use by another app. Close it and try again, or type the tag below.';
  return `The camera could not start (${err instanceof Error ? err.message : String(err)}). Type the tag below.`;
}

/** The camera's picture read for QR codes, frame after frame, until a code is taken or the panel closes. */
function useCameraCodes(video: React.RefObject<HTMLVideoElement | null>, onText: (text: string) => void) {
  const [state, setState] = useState<{ kind: 'starting' | 'watching' } | { kind: 'problem'; message: string }>({ kind: 'starting' });
  const handler = useRef(onText);
  handler.current = onText;
  useEffect(() => {
    let stopped = false;
    let stream: MediaStream | null = null;
    let frame = 0;
    async function start() {
      // Browsers give the camera only to secure pages (https, or localhost).
      if (!window.isSecureContext || !navigator.mediaDevices?.getUserMedia) {
        setState({ kind: 'problem', message: 'The camera works only on a secure address (https). Type the tag below instead.' });
        return;
      }
      try {
        stream = await navigator.mediaDevices.getUserMedia({ video: { facingMode: { ideal: 'environment' } }, audio: false });
      } catch (err) {
        if (!stopped) setState({ kind: 'problem', message: cameraProblem(err) });
        return;
      }
      if (stopped || !video.current) return stream.getTracks().forEach((t) => t.stop());
      video.current.srcObject = stream;
      await video.current.play().catch(() => undefined);
      const { readQrCode } = await import('../utils/decoder');
      setState({ kind: 'watching' });
      const look = async () => {
        if (stopped || !video.current) return;
        if (video.current.readyState >= 2) {
          try {
            const text = await readQrCode(video.current);
            if (text && !stopped) handler.current(text);
          } catch (err) {
            setState({
              kind: 'problem',
              message: `The code reader could not start (${err instanceof Error ? err.message : String(err)}). Type the tag below.`,
            });
            return;
          }
        }
        frame = requestAnimationFrame(() => void look());
      };
      void look();
    }
    void start();
    return () => {
      stopped = true;
      cancelAnimationFrame(frame);
      stream?.getTracks().forEach((t) => t.stop());
    };
  }, [video]);
  return state;
}

/**
 * A panel over the page: the tablet's camera reading a label's QR code, and a field to type the
 * tag or the label's link instead (typing always works, camera or not).
 */
export function LabelScanner({ title, hint, onCode, onClose }: { title: string; hint: string; onCode: CodeHandler; onClose: () => void }) {
  const video = useRef<HTMLVideoElement>(null);
  const typedRef = useRef<HTMLInputElement>(null);
  const [typed, setTyped] = useState('');
  const [message, setMessage] = useState<string | null>(null);
  const busy = useRef(false);
  const lastRaw = useRef<string | null>(null);

  const take = useCallback(
    async (raw: string, fromCamera: boolean) => {
      // The camera sees the same code many times a second: each one is acted on once.
      if (busy.current || (fromCamera && raw === lastRaw.current)) return;
      lastRaw.current = raw;
      const code = parseScannedCode(raw);
      if (!code) {
        setMessage(fromCamera ? 'That code is not one of our labels.' : 'Type an asset tag such as FC-014, or the link on a label.');
        return;
      }
      busy.current = true;
      try {
        const said = await onCode(code);
        if (said) setMessage(said);
      } catch (err) {
        setMessage(err instanceof Error ? err.message : String(err));
      } finally {
        busy.current = false;
      }
    },
    [onCode],
  );
  const camera = useCameraCodes(video, (text) => void take(text, true));

  useEffect(() => typedRef.current?.focus(), []);
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => e.key === 'Escape' && onClose();
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [onClose]);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    void take(typed, false);
  };

  return (
    <div className="fixed inset-0 z-50 flex items-start justify-center overflow-y-auto bg-ink/50 p-4" onClick={onClose}>
      <div
        role="dialog"
        aria-modal="true"
        aria-labelledby="label-scanner-title"
        className="mt-8 flex w-full max-w-lg flex-col gap-3 rounded-xl bg-card p-4 shadow-lg"
        onClick={(e) => e.stopPropagation()}
      >
        <div className="flex items-center justify-between gap-2">
          <h2 id="label-scanner-title" className="text-lg font-semibold">
            {title}
          </h2>
          <Button variant="secondary" onClick={onClose}>
            Close
          </Button>
        </div>
        <p className="text-base text-ink-soft">{hint}</p>
        <video
          ref={video}
          muted
          playsInline
          aria-label="Camera picture"
          className={`aspect-[4/3] w-full rounded-lg bg-ink object-cover ${camera.kind === 'problem' ? 'hidden' : ''}`}
        />
        <p role="status" className="text-base">
          {camera.kind === 'starting' && 'Starting the camera…'}
          {camera.kind === 'watching' && 'Hold the label’s code in the picture.'}
        </p>
        {camera.kind === 'problem' && <Notice tone="caution">{camera.message}</Notice>}
        {message && <Notice tone="error">{message}</Notice>}
        <form onSubmit={submit} className="flex items-end gap-2">
          <TextField
            ref={typedRef}
            className="flex-1"
            label="Or type the asset tag"
            name="typed-code"
            autoComplete="off"
            autoCapitalize="characters"
            value={typed}
            onChange={(e) => setTyped(e.target.value)}
          />
          <Button type="submit">Open</Button>
        </form>
      </div>
    </div>
  );
}
