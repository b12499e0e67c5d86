/** The sketcher screen (being built). */
export function SketchPage() {
  return <p className="p-6">Sketcher</p>;
}
