import { mkdir, readFile, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import { env } from "@/lib/env";
import { isStoredName } from "@/lib/uploads/image";

/**
 * Uploaded files live on disk under UPLOAD_DIR with random names; their rows
 * in `uploads` say who may read them. With several app instances, point
 * UPLOAD_DIR at shared storage.
 */
function filePath(storedName: string): string {
  // The name is ours (random hex + extension); refuse anything else before touching the disk.
  if (!isStoredName(storedName)) throw new Error("refusing an upload name that was not generated here");
  return path.join(path.resolve(env().UPLOAD_DIR), storedName);
}

export async function saveUploadFile(storedName: string, bytes: Uint8Array): Promise<void> {
  const target = filePath(storedName);
  await mkdir(path.dirname(target), { recursive: true });
  await writeFile(target, bytes, { flag: "wx" });
}

export async function readUploadFile(storedName: string): Promise<Buffer> {
  return readFile(filePath(storedName));
}

export async function removeUploadFile(storedName: string | null): Promise<void> {
  if (storedName) await rm(filePath(storedName), { force: true });
}
