"""What the engine works on and hands back: inputs, shapes, deck and slab, units, results, scope, errors."""
