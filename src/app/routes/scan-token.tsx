/**
 * A scanned label's landing page (/s/:token, the address printed in every QR code). Not signed
 * in: the shell's RequireAuth sends the person to sign in and back here. Unknown, replaced and
 * malformed codes each get their own plain message.
 */
import { Link, useLocation, useParams } from "react-router-dom";
import { paths } from "@/config/paths";
import { useUser } from "@/lib/auth";
import { isApiError } from "@/lib/api-client";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { buttonClasses } from "@/components/ui/button";
import { LoadingLine } from "@/components/ui/spinner";
import { useScan } from "@/features/labels/api/get-scan";
import { ScannedRecord } from "@/features/labels/components/scanned-record";

function ScanProblem({ error }: { error: unknown }) {
  let title = "This label could not be opened";
  let text = describeError(error);
  if (isApiError(error, 404) && error.code === "label_replaced") {
    title = "This label was replaced";
    text = `${error.message} Remove the old label from the container or instrument if it is still there.`;
  } else if (isApiError(error, 404) && error.code === "label_malformed") {
    title = "This is not a Phasebook label";
    text = "The code does not have the shape of a Phasebook label code.";
  } else if (isApiError(error, 404)) {
    title = "No record carries this label";
    text = "The code is not on any container or instrument in Phasebook. Check that the label belongs to this facility.";
  }
  return (
    <div className="mx-auto flex w-full max-w-md flex-col gap-3" data-testid="scan-problem-notice">
      <Alert tone="danger">
        <strong className="block">{title}</strong>
        {text}
      </Alert>
      <Link to={paths.scan.getHref()} className={buttonClasses("secondary", "md", "self-start")}>
        Scan another label
      </Link>
    </div>
  );
}

export function ScanTokenRoute() {
  const { token = "" } = useParams();
  const location = useLocation();
  const { data: user } = useUser();
  const scan = useScan(token);
  if (scan.isPending) return <LoadingLine label="Opening the label's record" />;
  if (scan.isError) return <ScanProblem error={scan.error} />;
  return (
    <div className="flex flex-col gap-3">
      <title>Scanned label · Phasebook</title>
      <h1 className="sr-only">Scanned label</h1>
      {(location.state as { reissued?: boolean } | null)?.reissued && (
        <Alert tone="ok" className="mx-auto w-full max-w-md">
          A new label was issued; the old one no longer opens anything. Print the new one and stick it over the old.
        </Alert>
      )}
      {user && <ScannedRecord scan={scan.data} token={token} user={user} />}
    </div>
  );
}
