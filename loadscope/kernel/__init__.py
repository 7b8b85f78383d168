"""The mechanics: pure functions on SI floats and numpy arrays, no I/O."""
