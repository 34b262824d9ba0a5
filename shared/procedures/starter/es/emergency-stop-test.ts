import type { Translations } from '../../translation'
import { protectiveGear, finalSignoff } from './common-steps'

export const emergencyStopTest: Translations = {
  es: {
    title: 'Probar las paradas de emergencia',
    summary: 'Comprobar que cada parada de emergencia para el husillo y todos los ejes, que nada vuelve a arrancar solo al soltar una parada, y apuntar el tiempo que tarda en pararse el husillo.',
    steps: {
      'test-hazard': {
        title: 'Prueba sin fresa y con la mesa despejada',
        body: 'Esta prueba hace girar el husillo y mueve los ejes a propósito. No pongas ninguna fresa y mantén a todo el mundo lejos de la mesa.',
        guidance: 'La prueba revisa un sistema de seguridad, así que cuenta con que puede fallar. Nadie debe estar donde un fallo le pueda hacer daño.',
        hazard: 'Si una parada falla durante la prueba, el husillo y el pórtico siguen moviéndose y pueden herir gravemente a quien esté cerca de la mesa.',
        avoid: 'Quita la fresa del husillo, y no aprietes la tuerca sobre una pinza vacía: aplasta la pinza. Haz girar el husillo sin herramienta como dice el manual del fabricante del husillo. Despeja la mesa. Deja a todo el mundo fuera de la zona de trabajo. Ten a mano otra forma de cortar la corriente.',
      },
      'protective-gear': protectiveGear,
      'power-home': {
        title: 'Enciende y haz el homing',
        body: 'Enciende la máquina y haz el homing. Sube Z del todo.',
        guidance: 'Hacer antes el homing hace que los ejes se muevan dentro de límites conocidos durante la prueba.',
      },
      'spindle-stop-test': {
        title: 'Para el husillo en marcha',
        body: 'Arranca el husillo a poca velocidad sin fresa puesta. Pulsa la parada de emergencia. Cronometra cuánto tarda el husillo en dejar de girar.',
        guidance: 'Usa un cronómetro o el reloj de esta tableta. Cuenta desde que pulsas hasta que la tuerca deja de girar.',
      },
      'spindle-stop-time': {
        title: 'Apunta el tiempo de parada del husillo',
        body: 'Escribe los segundos desde que pulsas la parada hasta que el husillo queda quieto.',
        guidance: 'El manual del fabricante del husillo puede dar un tiempo de parada. El rango de aquí es un punto de partida (práctica habitual, sin fuente publicada).',
        label: 'Tiempo de parada del husillo',
      },
      'axis-stop-test': {
        title: 'Para un eje en movimiento',
        body: 'Suelta la parada y reinicia el controlador. Mueve X despacio con el jog a lo ancho de la mesa. Pulsa la parada de emergencia. El pórtico tiene que pararse en el acto.',
        guidance: 'Repítelo con cada botón de parada de emergencia si la máquina tiene más de uno.',
      },
      'no-restart': {
        title: 'Suelta la parada y comprueba que nada vuelve a arrancar',
        body: 'Suelta la parada de emergencia. Nada puede moverse ni arrancar hasta que reinicies el controlador y des una orden.',
        guidance: 'Una máquina que arranca sola después de una parada o un corte de luz puede pillar a alguien que esté metiendo la mano.',
      },
      'failed-stop': {
        title: 'Una parada que falla deja la máquina fuera de servicio',
        body: 'Si alguna parada no detuvo la máquina, o algo volvió a arrancar solo, la máquina no se puede usar.',
        guidance: 'Añade una nota diciendo qué parada falló y cómo. El dueño se encarga de la reparación: un circuito de parada lo repara solo una persona cualificada, y una avería eléctrica solo un electricista autorizado. Nadie en la máquina intenta arreglarlo.',
        hazard: 'Una máquina con una parada que ha fallado no se puede parar en una emergencia y puede herir gravemente a alguien.',
        avoid: 'Corta la corriente, bloquéala y etiqueta la máquina fuera de servicio. Avisa al dueño. Deja la reparación a una persona cualificada, y las averías eléctricas a un electricista autorizado. No uses la máquina hasta que esté reparada y vuelva a pasar esta prueba.',
      },
      'final-signoff': finalSignoff('Cada parada de emergencia detuvo el husillo y los ejes, nada volvió a arrancar solo y el tiempo de parada está apuntado.'),
    },
  },
}
