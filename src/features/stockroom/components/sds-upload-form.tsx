/**
 * Upload a safety data sheet (manager, safety officer): a PDF with the date the supplier issued
 * or last revised it, which starts the review period. The server checks the content is a PDF;
 * the form checks what it can before sending so a wrong file is named at once.
 */
import { useRef, useState, type FormEvent } from "react";
import { SDS_MAX_BYTES, sdsUploadFields } from "@shared/schemas/stock";
import { isApiError } from "@/lib/api-client";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/input";
import { useUploadSds } from "../api/upload-sds";

type Errors = Partial<Record<"file" | "reviewedOn" | "supplier", string>>;

export function SdsUploadForm({ chemicalId }: { chemicalId: number }) {
  const upload = useUploadSds(chemicalId);
  const fileRef = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [reviewedOn, setReviewedOn] = useState("");
  const [supplier, setSupplier] = useState("");
  const [errors, setErrors] = useState<Errors>({});
  const [done, setDone] = useState<string | null>(null);

  function check(): Errors {
    const out: Errors = {};
    if (!file) out.file = "Choose the PDF file.";
    else if (file.size > SDS_MAX_BYTES) out.file = `The file is larger than ${SDS_MAX_BYTES / 1024 / 1024} MB.`;
    else if (file.type && file.type !== "application/pdf") out.file = `"${file.name}" is not a PDF file.`;
    const fields = sdsUploadFields.safeParse({ reviewedOn, supplier });
    if (!fields.success) for (const i of fields.error.issues) out[i.path[0] as "reviewedOn" | "supplier"] ??= i.message;
    return out;
  }

  async function submit(e: FormEvent) {
    e.preventDefault();
    setDone(null);
    const found = check();
    setErrors(found);
    if (Object.keys(found).length || !file) return;
    try {
      const sheet = await upload.mutateAsync({ file, reviewedOn, supplier });
      setDone(`${sheet.originalName} is on file.`);
      setFile(null);
      setReviewedOn("");
      setSupplier("");
      if (fileRef.current) fileRef.current.value = "";
    } catch (err) {
      // The server names the field ("file", "reviewedOn"); put its words there.
      if (isApiError(err)) setErrors({ file: err.fieldErrors.file, reviewedOn: err.fieldErrors.reviewedOn, supplier: err.fieldErrors.supplier });
    }
  }

  const fieldError = errors.file || errors.reviewedOn || errors.supplier;
  return (
    <form onSubmit={submit} className="mt-3 flex flex-col gap-2 border-t border-grey-200 pt-3" aria-label="Upload a safety data sheet" noValidate>
      <p className="text-xs font-medium text-grey-700">Upload a sheet</p>
      <div className="flex flex-wrap items-end gap-2">
        <Input
          ref={fileRef}
          label="PDF file"
          type="file"
          accept="application/pdf,.pdf"
          error={errors.file}
          onChange={(e) => setFile(e.target.files?.[0] ?? null)}
          fieldClassName="w-72"
          className="py-1"
          data-testid="sds-file"
        />
        <Input label="Issued or reviewed on" type="date" value={reviewedOn} error={errors.reviewedOn} onChange={(e) => setReviewedOn(e.target.value)} fieldClassName="w-44" data-testid="sds-reviewed-on" />
        <Input label="Supplier" value={supplier} error={errors.supplier} onChange={(e) => setSupplier(e.target.value)} fieldClassName="w-44" />
        <Button type="submit" loading={upload.isPending} data-testid="sds-upload">Upload</Button>
      </div>
      {upload.isError && !fieldError && <Alert tone="danger">{describeError(upload.error)}</Alert>}
      {done && <Alert tone="ok">{done}</Alert>}
    </form>
  );
}
