import { ItemNotFound } from "@/components/workspace/route-states";

export default function ScenarioNotFound() {
  return <ItemNotFound what="Scenario" />;
}
