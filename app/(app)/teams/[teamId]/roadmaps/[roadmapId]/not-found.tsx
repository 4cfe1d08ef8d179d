import { ItemNotFound } from "@/components/workspace/route-states";

export default function RoadmapNotFound() {
  return <ItemNotFound what="Roadmap" />;
}
