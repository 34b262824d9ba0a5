import type { StepTranslation } from '../../translation'

// Holds that recur across procedures (the same keys as their English builders).
export const protectiveGear: StepTranslation = {
  title: 'Ponte protección de ojos, oídos y contra el polvo',
  body: 'Ponte la protección antes de que arranque el husillo. No te la quites hasta que el husillo esté parado y el polvo se haya asentado.',
  guidance: 'Al cortar salen virutas tan rápido que pueden herir un ojo. El husillo y el colector de polvo juntos hacen tanto ruido que dañan el oído a lo largo de la jornada. El polvo fino de madera y de MDF se queda en el aire mucho después del corte y se respira hasta el fondo.',
  hazard: 'Las virutas que salen volando pueden dejarte ciego. Exponerte mucho tiempo al ruido del fresado causa una pérdida de oído permanente. El polvo de madera es una causa conocida de cáncer nasal, y el polvo de MDF además lleva formaldehído de la cola.',
  avoid: 'Usa gafas de seguridad con protección lateral. Usa orejeras o tapones. Usa una mascarilla o un respirador para polvo fino. Recógete el pelo largo y súbete las mangas sueltas.',
}

export const isolatePower: StepTranslation = {
  title: 'Corta la corriente antes de desenchufar nada',
  body: 'Apaga la máquina en su seccionador principal. Ponle tu propio candado y tu etiqueta. Luego comprueba que nada puede arrancar y vuelve a dejar el mando de arranque en apagado.',
  guidance: 'Los cables del husillo, de los variadores y del sensor nunca se desenchufan con corriente. Un variador guarda carga después de apagarlo: que sus luces estén apagadas no prueba que se haya descargado, así que espera el tiempo que indica su manual. El husillo sigue girando mientras se para. Con tu propio candado nadie más puede volver a encender la máquina mientras tienes las manos en ella. Si la máquina va enchufada a una toma, desenchufarla basta solo mientras la clavija siga bajo tu control, en tu mano o a la vista, donde nadie más pueda volver a enchufarla.',
  hazard: 'Desenchufar un cable con la corriente puesta puede darte una descarga eléctrica o hacer que la máquina arranque sin aviso. Un variador puede guardar energía después de apagarlo, y el husillo sigue girando mientras frena.',
  avoid: 'Apaga en el seccionador principal y pon tu propio candado y tu etiqueta. Espera a que el husillo se pare del todo y espera el tiempo de descarga que indica el manual del variador: que se apaguen sus luces no es prueba. Pulsa el mando de arranque para comprobar que nada se mueve y vuelve a dejarlo en apagado. Si la máquina tiene clavija, desenchúfala y tenla bajo tu control, donde solo tú puedas volver a enchufarla.',
}

export const stayWithMachine: StepTranslation = {
  title: 'Quédate con la máquina mientras corta',
  body: 'Quédate en la máquina desde que empieza el programa hasta que termina. Ten siempre una mano libre para llegar a la parada de emergencia.',
  guidance: 'Casi todo el daño de una fresadora en marcha pasa en los minutos en que nadie mira. Una fresa se puede romper, una pieza se puede soltar o las virutas en la campana de aspiración pueden empezar a arder. Parar a tiempo hace que un problema pequeño siga siendo pequeño.',
  hazard: 'Una fresa rota o una pieza suelta puede salir despedida por todo el taller. Las virutas calientes y el polvo pueden prenderse. Una máquina en marcha que se deja sola puede herir gravemente a alguien o provocar un incendio.',
  avoid: 'No te alejes de la máquina mientras corre el programa. No dejes que nadie entre en la zona de trabajo. Para el programa en cuanto cambie el ruido, salga humo o se pare la aspiración.',
}

export const spindleStopped: StepTranslation = {
  title: 'Para el husillo antes de tocar la fresa',
  body: 'Para el husillo y espera a que deje de girar. Apaga el husillo en su mando antes de acercar las manos a la pinza.',
  guidance: 'En un cambio de herramienta tienes los dedos justo en la fresa. Si un programa sigue o alguien pulsa arranque, el husillo coge velocidad en uno o dos segundos, mucho más rápido de lo que puedes apartar la mano.',
  hazard: 'Si el husillo arranca con tus manos en la pinza, la fresa puede hacerte cortes profundos o cortarte dedos.',
  avoid: 'Para el husillo y espera a que deje de girar. Apaga el husillo en su mando o córtale la corriente. Deja el programa en pausa o cerrado hasta que hayas quitado las llaves del husillo.',
}

export const homingClear: StepTranslation = {
  title: 'Apártate mientras la máquina hace el homing',
  body: 'En el homing cada eje se mueve solo hasta llegar a su final de carrera. No metas las manos en el recorrido del pórtico hasta que termine.',
  guidance: 'El pórtico pesa y se mueve sin aviso cuando empieza el homing. Donde pasa junto al bastidor o los topes pilla como una puerta.',
  hazard: 'El pórtico y el carro en movimiento pueden atrapar o golpear manos y brazos.',
  avoid: 'No dejes manos, herramientas ni cables sobre las guías ni sobre la mesa. Quédate fuera del recorrido del pórtico. Ten la parada de emergencia al alcance mientras se mueven los ejes.',
}

export const sharpEdges: StepTranslation = {
  title: 'Coge las fresas por el vástago',
  body: 'Las fresas y las fresas de planeado cortan aunque parezcan desafiladas. Cógelas por el vástago o con un trapo.',
  guidance: 'Casi todos los cortes en un cambio de herramienta pasan cuando la fresa resbala al aflojar o apretar la tuerca de la pinza.',
  hazard: 'Los filos pueden cortarte dedos y palmas, sobre todo si resbala una llave.',
  avoid: 'Coge las fresas por el vástago o envuelve los filos en un trapo. Usa guantes anticorte para manipularlas y quítatelos antes de que arranque el husillo.',
}

export const cutterRating: StepTranslation = {
  title: 'Revisa la velocidad máxima de la fresa y sus plaquitas',
  body: 'Busca la velocidad máxima marcada en la fresa de planeado o en su hoja. La velocidad de husillo planeada no puede pasar de ahí. Comprueba que cada tornillo de plaquita está apretado.',
  guidance: 'Muchas fresas de planeado grandes admiten bastante menos velocidad que el máximo del husillo. El Planificador avisa si la velocidad pasa del máximo de una fresa de la lista del taller. Aprieta los tornillos de las plaquitas solo con la llave del fabricante.',
  hazard: 'Una fresa que gira por encima de su velocidad máxima, o con un tornillo de plaquita flojo, puede romperse o lanzar una plaquita por el taller y herir gravemente a alguien.',
  avoid: 'Mantén la velocidad del husillo igual o por debajo del máximo marcado en la fresa. Aprieta todos los tornillos de las plaquitas antes de arrancar el husillo. Cambia las plaquitas desportilladas y los tornillos dañados.',
}

export const finalSignoff = (statement: string): StepTranslation => ({
  title: 'Firma el trabajo',
  body: 'Lee la declaración de abajo. Firma solo si todo lo que dice es verdad.',
  guidance: 'En un trabajo guiado tu formador revisa el trabajo contigo y firma con su propio PIN. Tu firma y la suya quedan en el registro.',
  statement,
})
