import { getDb } from "@/db";
import { seedDemo } from "@/db/seed";

export const BASE = "http://localhost:3000";

export function get(pathname: string, init?: RequestInit): Request {
  return new Request(new URL(pathname, BASE), init);
}

export function params<T extends Record<string, string>>(p: T): { params: Promise<T> } {
  return { params: Promise.resolve(p) };
}

export async function seedDemoSite() {
  return seedDemo(getDb());
}
