/**
 * The phone camera as a QR reader: getUserMedia with the rear camera, frames decoded by jsqr a
 * few times a second until a code reads. The camera stops as soon as the component unmounts or
 * a code is read, so the light on the phone goes off.
 */
import { useEffect, useRef, useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { decodeImageData, frameFrom } from "./qr-decode";

interface CameraScannerProps {
  onRead: (text: string) => void;
}

type CameraState = "idle" | "starting" | "running" | "unavailable" | "denied";

export function CameraScanner({ onRead }: CameraScannerProps) {
  const videoRef = useRef<HTMLVideoElement>(null);
  const [state, setState] = useState<CameraState>("idle");
  const onReadRef = useRef(onRead);
  useEffect(() => {
    onReadRef.current = onRead;
  }, [onRead]);

  useEffect(() => {
    if (state !== "starting") return;
    let stream: MediaStream | null = null;
    let timer: number | undefined;
    let stopped = false;
    const stop = () => {
      stopped = true;
      if (timer !== undefined) window.clearTimeout(timer);
      stream?.getTracks().forEach((t) => t.stop());
    };
    (async () => {
      if (!navigator.mediaDevices?.getUserMedia) {
        setState("unavailable");
        return;
      }
      try {
        stream = await navigator.mediaDevices.getUserMedia({ video: { facingMode: { ideal: "environment" } }, audio: false });
      } catch (e) {
        setState((e as DOMException).name === "NotAllowedError" ? "denied" : "unavailable");
        return;
      }
      if (stopped) return stop();
      const video = videoRef.current!;
      video.srcObject = stream;
      await video.play().catch(() => undefined);
      setState("running");
      // About five frames a second: quick enough to feel instant, light on a phone's battery.
      const tick = () => {
        if (stopped) return;
        const frame = frameFrom(video);
        const text = frame && decodeImageData(frame);
        if (text) {
          stop();
          onReadRef.current(text);
          return;
        }
        timer = window.setTimeout(tick, 200);
      };
      tick();
    })();
    return stop;
  }, [state]);

  return (
    <div className="flex flex-col gap-2">
      <div className="relative aspect-[4/3] w-full overflow-hidden rounded-lg bg-grey-900">
        <video ref={videoRef} className="size-full object-cover" muted playsInline data-testid="scan-video" />
        {state !== "running" && (
          <div className="absolute inset-0 flex flex-col items-center justify-center gap-2 p-4 text-center text-sm text-grey-100">
            {state === "idle" && (
              <Button variant="primary" onClick={() => setState("starting")} data-testid="scan-start-camera">
                Start the camera
              </Button>
            )}
            {state === "starting" && <span>Asking for the camera…</span>}
          </div>
        )}
        {state === "running" && (
          <div className="pointer-events-none absolute inset-[18%] rounded-md border-2 border-white/80" aria-hidden="true" />
        )}
      </div>
      {state === "denied" && (
        <Alert tone="warning">The browser was not allowed to use the camera. Allow it in the site settings, or upload a photo of the label below.</Alert>
      )}
      {state === "unavailable" && (
        <Alert tone="warning">No camera is available here (or the page is not served over HTTPS). Upload a photo of the label or type its code below.</Alert>
      )}
      {state === "running" && <p className="text-xs text-grey-600">Hold the label inside the frame, about a hand's width from the camera.</p>}
    </div>
  );
}
