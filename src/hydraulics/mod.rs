pub mod catalogue { 
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Material { Steel }
impl Material { pub fn from_keyword(s: &str) -> Option<Material> { (s=="steel"||s=="pvc").then_some(Material::Steel) } pub fn keyword(self) -> &'static str { "steel" } pub fn all() -> &'static [Material] { &[Material::Steel] } }
pub struct PipeSize { pub inner_diameter_m: f64, pub standard: &'static str }
pub struct CatalogueError { pub message: String, pub nearest: Vec<String> }
pub fn pipe_size(_m: Material, n: &str, s: &str) -> Result<PipeSize, CatalogueError> { if s=="40" {Ok(PipeSize{inner_diameter_m: 0.1, standard: "TEMP"})} else {Err(CatalogueError{message: format!("no {n} {s}"), nearest: vec!["x".into()]})} }
}
pub mod fittings {
#[derive(Clone, Debug, PartialEq)] pub struct FittingSpec { pub name: &'static str, pub needs_beta: bool, pub needs_angle: bool }
static F: [FittingSpec; 1] = [FittingSpec{name:"x", needs_beta:false, needs_angle:false}];
pub fn fitting(name: &str) -> Option<&'static FittingSpec> { let _ = name; Some(&F[0]) }
pub fn suggest_fitting(_n: &str) -> Vec<&'static str> { vec![] }
}
