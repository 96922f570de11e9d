import { AppError } from "@/lib/errors";
import { IMAGE_MIME, MAX_IMAGE_BYTES, randomStoredName, sniffImage } from "@/lib/uploads/image";

export type CheckedPlan = { bytes: Uint8Array; storedName: string; mimeType: string; byteSize: number; width: number; height: number; originalName: string };

/**
 * Reads a multipart form with an optional `plan` file and a `name` field. The
 * type comes from the content, never the file name; size is limited before and
 * after reading.
 */
export async function readPlanForm(request: Request): Promise<{ name: string | null; plan: CheckedPlan | null }> {
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > MAX_IMAGE_BYTES + 64 * 1024) throw new AppError("too_large", `The plan is larger than ${MAX_IMAGE_BYTES / 1024 / 1024} MiB.`, { fields: { plan: [`At most ${MAX_IMAGE_BYTES / 1024 / 1024} MiB`] } });
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    throw new AppError("bad_request", "Send the plan as a multipart form.");
  }
  const name = form.get("name");
  const file = form.get("plan");
  if (name !== null && typeof name !== "string") throw new AppError("bad_request", "The name must be text.");
  if (file === null || (file instanceof File && file.size === 0)) return { name, plan: null };
  if (!(file instanceof File)) throw new AppError("bad_request", "The plan must be a file.", { fields: { plan: ["Choose an image file"] } });
  if (file.size > MAX_IMAGE_BYTES) throw new AppError("too_large", `The plan is larger than ${MAX_IMAGE_BYTES / 1024 / 1024} MiB.`, { fields: { plan: [`At most ${MAX_IMAGE_BYTES / 1024 / 1024} MiB`] } });
  const bytes = new Uint8Array(await file.arrayBuffer());
  const sniffed = sniffImage(bytes);
  if (!sniffed.ok) throw new AppError(sniffed.code === "too-large" ? "too_large" : "bad_request", sniffed.message, { fields: { plan: [sniffed.message] } });
  return {
    name,
    plan: { bytes, storedName: randomStoredName(sniffed.type), mimeType: IMAGE_MIME[sniffed.type], byteSize: bytes.byteLength, width: sniffed.width, height: sniffed.height, originalName: file.name.slice(0, 200) },
  };
}

/** The row to store for a checked plan (everything but the bytes). */
export function planRecord(plan: CheckedPlan): Omit<CheckedPlan, "bytes"> {
  const { storedName, mimeType, byteSize, width, height, originalName } = plan;
  return { storedName, mimeType, byteSize, width, height, originalName };
}
