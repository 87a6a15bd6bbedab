/** A scanned label's landing page (placeholder until the label work lands). */
import { useParams } from "react-router-dom";
import { PlannedScreen } from "@/components/planned-screen";

export function ScanTokenRoute() {
  const { token = "" } = useParams();
  return (
    <PlannedScreen title="Scanned label">
      The container or instrument behind label <span className="font-mono">{token}</span> will open here.
    </PlannedScreen>
  );
}
