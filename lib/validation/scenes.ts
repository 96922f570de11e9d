/** Shape of a scene over JSON. */
export type SceneDto = {
  id: string;
  number: number;
  name: string;
  fadeMs: number;
  isOccupantRecallable: boolean;
  levels: { zoneId?: string; deviceId?: string; level: number }[];
};
