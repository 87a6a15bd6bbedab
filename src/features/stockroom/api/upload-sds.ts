/** POST /api/chemicals/:id/sds: a safety data sheet as a PDF (multipart), with its review date and supplier. */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { sdsDto } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { stockKeys } from "./keys";

export interface SdsUpload {
  file: File;
  reviewedOn: string;
  supplier: string;
}

export async function uploadSds(chemicalId: number, v: SdsUpload) {
  const form = new FormData();
  // Text fields first: the server reads them beside the file in one pass.
  form.append("reviewedOn", v.reviewedOn);
  form.append("supplier", v.supplier);
  form.append("file", v.file, v.file.name);
  const data = await api.postForm<unknown>(`/chemicals/${chemicalId}/sds`, form);
  return parseResponse(z.object({ sheet: sdsDto }), data, "POST /api/chemicals/:id/sds").sheet;
}

export function useUploadSds(chemicalId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (v: SdsUpload) => uploadSds(chemicalId, v),
    // The Safety review's "sheets due" lists read the same table; they refetch when opened.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: stockKeys.sds(chemicalId) }),
  });
}
