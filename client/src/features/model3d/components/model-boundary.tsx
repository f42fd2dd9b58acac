/** Around every 3D canvas: a plain message instead of a blank box when WebGL is missing or the scene fails. */
import { Component, type ReactNode } from 'react';

export function webglAvailable(): boolean {
  try {
    const c = document.createElement('canvas');
    return !!(c.getContext('webgl2') ?? c.getContext('webgl'));
  } catch {
    return false;
  }
}

const Fallback = ({ reason }: { reason: string }) => (
  <div className="rounded-lg border-2 border-line bg-card p-4" role="status" data-testid="model-fallback">
    <p className="font-bold">The 3D model cannot be shown on this device.</p>
    <p className="mt-1 text-sm text-ink-soft">{reason} Every load is still in the Loads section.</p>
  </div>
);

export class ModelBoundary extends Component<{ children: ReactNode }, { failed: boolean }> {
  override state = { failed: false };
  static getDerivedStateFromError() {
    return { failed: true };
  }
  override render() {
    if (typeof document !== 'undefined' && !webglAvailable()) return <Fallback reason="This browser has no WebGL." />;
    if (this.state.failed) return <Fallback reason="The 3D view stopped with an error." />;
    return this.props.children;
  }
}
