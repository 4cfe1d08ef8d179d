import { EditorSkeleton } from "@/components/ui/editor-skeleton";

export default function Loading() {
  return <EditorSkeleton label="Loading the roadmap" />;
}
