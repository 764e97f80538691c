/**
 * A message that appears when the user leaves a field pushes down whatever lies below it. When
 * the field is left by pressing the mouse on something else (a radio button, the next box),
 * that something moves between the press and the release, and the click lands elsewhere or
 * nowhere. `afterPress(show)` runs `show` at once when no pointer button is down (the field
 * was left with Tab), and otherwise once the press is over, after its click.
 */
let pressed = false;
if (typeof window !== 'undefined') {
  window.addEventListener('pointerdown', () => (pressed = true), true);
  window.addEventListener('pointerup', () => (pressed = false), true);
  window.addEventListener('pointercancel', () => (pressed = false), true);
}

export function afterPress(show: () => void): void {
  if (!pressed) {
    show();
    return;
  }
  const released = () => {
    window.removeEventListener('pointerup', released, true);
    window.removeEventListener('pointercancel', released, true);
    // The click follows the release in the same task; show the message after it.
    setTimeout(show, 0);
  };
  window.addEventListener('pointerup', released, true);
  window.addEventListener('pointercancel', released, true);
}
