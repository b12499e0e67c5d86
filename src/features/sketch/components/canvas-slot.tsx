/** Where the 3D sketch mounts. */
export function CanvasSlot() {
  return (
    <div className="flex h-full items-center justify-center bg-steel-100 text-sm text-steel-500" data-testid="canvas-slot">
      The 3D sketch appears here.
    </div>
  );
}
