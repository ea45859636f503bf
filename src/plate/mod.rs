//! Stage `plate`: electrodes + routes → `Artwork` (glass, ledge, seal, marks, labels).

use crate::artwork::Artwork;
use crate::electrode::Electrodes;
use crate::layout::Layout;
use crate::route::Routes;
use crate::Result;

/// Assembles the artwork of both plates.
pub fn build_artwork(_layout: &Layout, _el: &Electrodes, _routes: &Routes) -> Result<Artwork> {
    Err(crate::Error::Bug("plate stage not written yet".into()))
}
