import { ItemNotFound } from "@/components/workspace/route-states";

export default function BaselineNotFound() {
  return <ItemNotFound what="Baseline" />;
}
