//! Browser binding and live calculator widget for Modebench.
