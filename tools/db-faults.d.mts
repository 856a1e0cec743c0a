export interface ClusterRef {
  name: string;
  port: number;
}
export function serverPids(cluster: ClusterRef): number[];
export function freezeCluster(cluster: ClusterRef): number[];
export function thawCluster(pids: number[]): void;
export function crashCluster(cluster: ClusterRef): number[];
