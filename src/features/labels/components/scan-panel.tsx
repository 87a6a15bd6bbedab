/**
 * The Scan page's readers: the camera, a photo of the label, or the code typed or pasted. Each
 * hands its text to the same check; a text that holds no Phasebook label code gets a message
 * instead of a navigation.
 */
import { useState, type FormEvent } from "react";
import { useNavigate } from "react-router-dom";
import { tokenFromScan } from "@shared/domain/labels";
import { paths } from "@/config/paths";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input } from "@/components/ui/input";
import { CameraScanner } from "./camera-scanner";
import { decodeImageFile } from "./qr-decode";

export function ScanPanel() {
  const navigate = useNavigate();
  const [message, setMessage] = useState<string | null>(null);
  const [typed, setTyped] = useState("");
  const [reading, setReading] = useState(false);

  const handle = (text: string) => {
    const token = tokenFromScan(text);
    if (!token) {
      setMessage(`This code is not a Phasebook label${text.length < 120 ? ` (it reads “${text}”)` : ""}.`);
      return;
    }
    setMessage(null);
    navigate(paths.scanToken.getHref(token));
  };

  const onFile = async (file: File | undefined) => {
    if (!file) return;
    setReading(true);
    setMessage(null);
    try {
      const text = await decodeImageFile(file);
      if (text) handle(text);
      else setMessage("No QR code could be read in this photo. Take it straight on, closer, in good light, and try again.");
    } catch {
      setMessage("This file could not be opened as an image.");
    } finally {
      setReading(false);
    }
  };

  const onSubmit = (e: FormEvent) => {
    e.preventDefault();
    if (!typed.trim()) {
      setMessage("Type or paste the code printed under the QR code, or the whole label address.");
      return;
    }
    handle(typed);
  };

  return (
    <div className="mx-auto flex w-full max-w-md flex-col gap-3">
      {message && (
        <Alert tone="danger" className="break-words">
          <span data-testid="scan-message">{message}</span>
        </Alert>
      )}
      <Card title="Camera" bodyClassName="p-3">
        <CameraScanner onRead={handle} />
      </Card>
      <Card title="Photo of the label" bodyClassName="p-3">
        <label className="flex flex-col gap-1 text-sm text-grey-700">
          <span className="text-xs">Take or choose a photo; the code is read on this device.</span>
          <input
            type="file"
            accept="image/*"
            capture="environment"
            data-testid="scan-photo"
            disabled={reading}
            className="text-sm file:mr-3 file:rounded-md file:border file:border-grey-300 file:bg-white file:px-3 file:py-1.5 file:text-sm"
            onChange={(e) => {
              void onFile(e.target.files?.[0]);
              e.target.value = "";
            }}
          />
        </label>
        {reading && <p className="mt-2 text-xs text-grey-600">Reading the photo…</p>}
      </Card>
      <Card title="Type or paste the code" bodyClassName="p-3">
        <form onSubmit={onSubmit} className="flex items-end gap-2" noValidate>
          <Input
            label="Label code or address"
            fieldClassName="flex-1"
            autoCapitalize="off"
            autoCorrect="off"
            spellCheck={false}
            value={typed}
            onChange={(e) => setTyped(e.target.value)}
            data-testid="scan-code-input"
          />
          <Button type="submit" data-testid="scan-code-submit">
            Open
          </Button>
        </form>
      </Card>
    </div>
  );
}
